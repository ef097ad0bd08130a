import { afterAll, describe, expect, it } from 'vitest';
import { Sequelize } from 'sequelize';
import mariadb from 'mariadb';
import { migrator } from '../../src/lib/server/db/migrator';

// A scratch database of its own, so running every migration down never touches the test data.
const base = new URL(process.env.DATABASE_URL!);
const scratch = `${base.pathname.slice(1)}_scratch_migrations`;
const admin = new Sequelize(
	'',
	decodeURIComponent(base.username),
	decodeURIComponent(base.password),
	{
		dialect: 'mariadb',
		dialectModule: mariadb,
		host: base.hostname,
		port: Number(base.port),
		logging: false
	}
);
let sequelize: Sequelize;

afterAll(async () => {
	await sequelize?.close();
	await admin.query(`DROP DATABASE IF EXISTS \`${scratch}\``);
	await admin.close();
});

describe('migrations', () => {
	it('run up, all the way down, and up again', async () => {
		await admin.query(`DROP DATABASE IF EXISTS \`${scratch}\``);
		await admin.query(`CREATE DATABASE \`${scratch}\` CHARACTER SET utf8mb4`);
		sequelize = new Sequelize(
			scratch,
			decodeURIComponent(base.username),
			decodeURIComponent(base.password),
			{
				dialect: 'mariadb',
				dialectModule: mariadb,
				host: base.hostname,
				port: Number(base.port),
				logging: false
			}
		);
		const m = migrator(sequelize);
		const all = (await m.pending()).map((x) => x.name);
		expect(all.length).toBeGreaterThan(0);
		await m.up();
		const tables = async () =>
			(await sequelize.getQueryInterface().showAllTables())
				.map((t) => (typeof t === 'string' ? t : (t as { tableName: string }).tableName))
				.filter((t) => t !== 'schema_migrations');
		const afterUp = (await tables()).sort();
		for (const t of ['organisations', 'users', 'blocks', 'visits', 'notifications', 'audit_log']) {
			expect(afterUp).toContain(t);
		}
		await m.down({ to: 0 });
		expect(await tables()).toEqual([]);
		await m.up();
		expect((await tables()).sort()).toEqual(afterUp);
		expect((await m.executed()).map((x) => x.name)).toEqual(all);
	});
});
