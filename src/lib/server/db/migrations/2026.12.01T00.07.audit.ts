import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';
import { fk } from './helpers';

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('audit_log', {
		id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
		organisation_id: fk('organisations', { allowNull: true, onDelete: 'CASCADE' }),
		actor_id: fk('users', { allowNull: true }),
		action: { type: DataTypes.STRING(60), allowNull: false },
		entity: { type: DataTypes.STRING(60), allowNull: false },
		entity_id: { type: DataTypes.STRING(40), allowNull: true },
		details: { type: DataTypes.JSON, allowNull: true },
		created_at: { type: DataTypes.DATE(3), allowNull: false }
	});
	await qi.addIndex('audit_log', ['organisation_id', 'created_at']);
	await qi.addIndex('audit_log', ['entity', 'entity_id']);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('audit_log');
};
