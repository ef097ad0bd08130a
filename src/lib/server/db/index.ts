import type { Sequelize } from 'sequelize';
import { config } from '../config';
import { connect } from './connect';

let instance: Sequelize | null = null;

/** The app's shared Sequelize instance, opened on first use. */
export function db(): Sequelize {
	if (!instance) {
		const c = config();
		instance = connect({
			url: c.DATABASE_URL,
			replicaUrls: c.DATABASE_REPLICA_URLS?.split(',').filter(Boolean)
		});
	}
	return instance;
}

export * from './models';
