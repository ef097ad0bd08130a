import { existsSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { connect } from '../../src/lib/server/db/connect';
import { migrator } from '../../src/lib/server/db/migrator';
import { seedDemo } from '../../src/lib/server/db/seeders/demo';
import { ensureBuild } from './build';
import { ensureDatabase, startMariaDB, type MariaDB } from './mariadb';
import { startProcess, waitForHttp } from './procs';
import { databaseUrl, profileEnv, root, type Profile } from './profile';

const tsx = join(root, 'node_modules/.bin/tsx');

/** Starts MariaDB for a profile, creates the database, migrates and seeds the demo scenario. */
export async function startDatabase(p: Profile, opts: { fresh?: boolean; seed?: boolean } = {}) {
	const t0 = Date.now();
	const db = await startMariaDB(p.dataDir, p.dbPort);
	ensureDatabase(db, p.dbName, opts.fresh);
	const sequelize = connect({ url: databaseUrl(p) });
	try {
		const done = await migrator(sequelize).up();
		if (done.length) console.log(`• Migrated: ${done.length} migration(s) applied`);
		if (opts.seed !== false) {
			const summary = await seedDemo(sequelize);
			console.log(`• Demo scenario: ${summary}`);
		}
	} finally {
		await sequelize.close();
	}
	console.log(`• MariaDB ready on 127.0.0.1:${p.dbPort} (${Date.now() - t0} ms)`);
	return db;
}

/** Starts the fakes in mocks/ and the built app for a profile, and waits until they answer. */
export async function startServices(p: Profile, opts: { quiet?: boolean } = {}) {
	const env = { ...process.env, ...profileEnv(p), NODE_ENV: 'production' };
	mkdirSync(env.PHOTO_DIR, { recursive: true });
	startProcess('mail', tsx, ['mocks/mail/server.ts'], { cwd: root, env, quiet: opts.quiet });
	if (existsSync(join(root, 'mocks/sms/server.ts'))) {
		startProcess('sms', tsx, ['mocks/sms/server.ts'], { cwd: root, env, quiet: opts.quiet });
	}
	const out = await ensureBuild(p.slot);
	// APP_NODE_ARGS (e.g. "--cpu-prof --cpu-prof-dir=.data/prof") goes to the app's node only.
	const nodeArgs = (process.env.APP_NODE_ARGS ?? '').split(' ').filter(Boolean);
	startProcess('app', process.execPath, [...nodeArgs, join(out, 'index.js')], {
		cwd: root,
		env,
		quiet: opts.quiet
	});
	await Promise.all([
		waitForHttp(`http://127.0.0.1:${p.inboxPort}/`),
		waitForHttp(`http://127.0.0.1:${p.appPort}/`)
	]);
	return env;
}

export type { MariaDB };
