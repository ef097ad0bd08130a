import mariadb from 'mariadb';
import { Sequelize, type Options } from 'sequelize';
import { initModels } from './models';

export interface ConnectOptions {
	url: string;
	logging?: boolean;
	pool?: Options['pool'];
	/** Read replicas for maps, triage and the regional overview. */
	replicaUrls?: string[];
}

function parts(url: string) {
	const u = new URL(url);
	return {
		host: u.hostname,
		port: Number(u.port || 3306),
		username: decodeURIComponent(u.username),
		password: decodeURIComponent(u.password),
		database: u.pathname.replace(/^\//, '')
	};
}

/** Opens a Sequelize instance on MariaDB and binds every model to it. */
export function connect(opts: ConnectOptions): Sequelize {
	const main = parts(opts.url);
	const sequelize = new Sequelize(main.database, main.username, main.password, {
		dialect: 'mariadb',
		dialectModule: mariadb,
		host: main.host,
		port: main.port,
		logging: opts.logging ? console.log : false,
		pool: opts.pool ?? { max: 10, min: 0, acquire: 5_000, idle: 10_000 },
		dialectOptions: { connectTimeout: 3_000 },
		timezone: '+00:00',
		define: { underscored: true },
		...(opts.replicaUrls?.length
			? { replication: { write: main, read: opts.replicaUrls.map(parts) } }
			: {})
	});
	initModels(sequelize);
	return sequelize;
}
