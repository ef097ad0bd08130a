import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';
import { timestamps } from './helpers';

export const ROLES = ['admin', 'agronomist', 'scout', 'grower', 'regional'] as const;

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('organisations', {
		id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
		name: { type: DataTypes.STRING(160), allowNull: false },
		slug: { type: DataTypes.STRING(80), allowNull: false, unique: true },
		kind: { type: DataTypes.ENUM('advisory', 'coop', 'extension'), allowNull: false },
		region: { type: DataTypes.STRING(160), allowNull: false },
		timezone: { type: DataTypes.STRING(64), allowNull: false, defaultValue: 'UTC' },
		...timestamps
	});
	await qi.createTable('users', {
		id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
		name: { type: DataTypes.STRING(160), allowNull: false },
		email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
		email_verified: { type: DataTypes.DATE, allowNull: true },
		password_hash: { type: DataTypes.STRING(255), allowNull: true },
		phone_e164: { type: DataTypes.STRING(20), allowNull: true },
		image: { type: DataTypes.STRING(500), allowNull: true },
		unit_system: {
			type: DataTypes.ENUM('metric', 'imperial'),
			allowNull: false,
			defaultValue: 'metric'
		},
		...timestamps
	});
	await qi.createTable('memberships', {
		id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
		user_id: {
			type: DataTypes.INTEGER,
			allowNull: false,
			references: { model: 'users', key: 'id' },
			onDelete: 'CASCADE'
		},
		organisation_id: {
			type: DataTypes.INTEGER,
			allowNull: false,
			references: { model: 'organisations', key: 'id' },
			onDelete: 'CASCADE'
		},
		role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
		...timestamps
	});
	await qi.addIndex('memberships', ['user_id', 'organisation_id'], { unique: true });
	await qi.addIndex('memberships', ['organisation_id', 'role']);

	// Auth.js adapter tables (created here, never by the adapter's sync()).
	await qi.createTable('auth_accounts', {
		id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
		user_id: {
			type: DataTypes.INTEGER,
			allowNull: false,
			references: { model: 'users', key: 'id' },
			onDelete: 'CASCADE'
		},
		type: { type: DataTypes.STRING(40), allowNull: false },
		provider: { type: DataTypes.STRING(80), allowNull: false },
		provider_account_id: { type: DataTypes.STRING(191), allowNull: false },
		refresh_token: { type: DataTypes.TEXT, allowNull: true },
		access_token: { type: DataTypes.TEXT, allowNull: true },
		expires_at: { type: DataTypes.INTEGER, allowNull: true },
		token_type: { type: DataTypes.STRING(40), allowNull: true },
		scope: { type: DataTypes.STRING(255), allowNull: true },
		id_token: { type: DataTypes.TEXT, allowNull: true },
		session_state: { type: DataTypes.STRING(255), allowNull: true }
	});
	await qi.addIndex('auth_accounts', ['provider', 'provider_account_id'], { unique: true });
	await qi.createTable('auth_sessions', {
		id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
		session_token: { type: DataTypes.STRING(191), allowNull: false, unique: true },
		user_id: {
			type: DataTypes.INTEGER,
			allowNull: false,
			references: { model: 'users', key: 'id' },
			onDelete: 'CASCADE'
		},
		expires: { type: DataTypes.DATE, allowNull: false }
	});
	await qi.createTable('auth_verification_tokens', {
		identifier: { type: DataTypes.STRING(191), allowNull: false, primaryKey: true },
		token: { type: DataTypes.STRING(191), allowNull: false, primaryKey: true },
		expires: { type: DataTypes.DATE, allowNull: false }
	});
	await qi.createTable('login_attempts', {
		id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
		email: { type: DataTypes.STRING(254), allowNull: false },
		ip: { type: DataTypes.STRING(64), allowNull: false },
		succeeded: { type: DataTypes.BOOLEAN, allowNull: false },
		created_at: { type: DataTypes.DATE(3), allowNull: false }
	});
	await qi.addIndex('login_attempts', ['email', 'created_at']);
	await qi.addIndex('login_attempts', ['ip', 'created_at']);
};

export const down: Migration = async ({ context: qi }) => {
	for (const t of [
		'login_attempts',
		'auth_verification_tokens',
		'auth_sessions',
		'auth_accounts',
		'memberships',
		'users',
		'organisations'
	]) {
		await qi.dropTable(t);
	}
};
