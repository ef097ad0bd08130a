import mariadb from 'mariadb';
import { Sequelize, type Options } from 'sequelize';
import { initModels } from './models';

export interface ConnectOptions {
	url: string;
	logging?: boolean;
	pool?: Options['pool'];
}

/** Host, port, user, password and database name from a `mariadb://` URL. */
export function parts(url: string) {
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
	const sequelize = connectRaw(opts);
	initModels(sequelize);
	return sequelize;
}

/** A Sequelize instance for raw queries only (e.g. on a read replica); no models bound. */
export function connectRaw(opts: ConnectOptions): Sequelize {
	const main = parts(opts.url);
	return new Sequelize(main.database, main.username, main.password, {
		dialect: 'mariadb',
		dialectModule: mariadb,
		host: main.host,
		port: main.port,
		logging: opts.logging ? console.log : false,
		pool: opts.pool ?? { max: 10, min: 0, acquire: 5_000, idle: 10_000 },
		dialectOptions: { connectTimeout: 3_000 },
		timezone: '+00:00',
		define: { underscored: true }
	});
}
