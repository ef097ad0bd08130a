import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';
import { fk, id, timestamps } from './helpers';
import { LEVEL_KEYS } from './2026.12.01T00.03.farms';

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('subscriptions', {
		id,
		user_id: fk('users'),
		channel: { type: DataTypes.ENUM('sms', 'email'), allowNull: false },
		farm_id: fk('farms', { allowNull: true, onDelete: 'CASCADE' }),
		block_id: fk('blocks', { allowNull: true, onDelete: 'CASCADE' }),
		min_level: { type: DataTypes.ENUM(...LEVEL_KEYS), allowNull: false, defaultValue: 'action' },
		quiet_start: { type: DataTypes.STRING(5), allowNull: true },
		quiet_end: { type: DataTypes.STRING(5), allowNull: true },
		active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
		...timestamps
	});
	await qi.addIndex('subscriptions', ['user_id']);

	await qi.createTable('notifications', {
		id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
		organisation_id: fk('organisations'),
		user_id: fk('users', { allowNull: true }),
		block_id: fk('blocks', { allowNull: true, onDelete: 'CASCADE' }),
		recommendation_id: fk('recommendations', { allowNull: true, onDelete: 'CASCADE' }),
		channel: { type: DataTypes.ENUM('sms', 'email'), allowNull: false },
		kind: { type: DataTypes.STRING(40), allowNull: false },
		dedupe_key: { type: DataTypes.STRING(191), allowNull: false, unique: true },
		to_address: { type: DataTypes.STRING(254), allowNull: false },
		subject: { type: DataTypes.STRING(300), allowNull: true },
		body_text: { type: DataTypes.TEXT, allowNull: false },
		body_html: { type: DataTypes.TEXT, allowNull: true },
		status: {
			type: DataTypes.ENUM(
				'pending',
				'sending',
				'sent',
				'delivered',
				'failed',
				'undelivered',
				'suppressed'
			),
			allowNull: false,
			defaultValue: 'pending'
		},
		attempts: { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 0 },
		not_before: { type: DataTypes.DATE(3), allowNull: false },
		claimed_by: { type: DataTypes.STRING(80), allowNull: true },
		claimed_at: { type: DataTypes.DATE(3), allowNull: true },
		provider_id: { type: DataTypes.STRING(80), allowNull: true },
		last_error: { type: DataTypes.STRING(500), allowNull: true },
		sent_at: { type: DataTypes.DATE(3), allowNull: true },
		delivered_at: { type: DataTypes.DATE(3), allowNull: true },
		...timestamps
	});
	await qi.addIndex('notifications', ['status', 'not_before']);
	await qi.addIndex('notifications', ['organisation_id', 'created_at']);
	await qi.addIndex('notifications', ['provider_id']);

	await qi.createTable('sms_opt_outs', {
		phone_e164: { type: DataTypes.STRING(20), primaryKey: true },
		opted_out_at: { type: DataTypes.DATE, allowNull: false }
	});
};

export const down: Migration = async ({ context: qi }) => {
	for (const t of ['sms_opt_outs', 'notifications', 'subscriptions']) await qi.dropTable(t);
};
