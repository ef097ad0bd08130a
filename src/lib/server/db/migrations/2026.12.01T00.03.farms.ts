import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';
import { fk, id, timestamps } from './helpers';

export const LEVEL_KEYS = ['calm', 'stirring', 'action', 'severe'];

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('farms', {
		id,
		organisation_id: fk('organisations'),
		grower_id: fk('users', { onDelete: 'RESTRICT' }),
		name: { type: DataTypes.STRING(160), allowNull: false },
		locality: { type: DataTypes.STRING(160), allowNull: true },
		lat: { type: DataTypes.DOUBLE, allowNull: false },
		lon: { type: DataTypes.DOUBLE, allowNull: false },
		...timestamps
	});
	await qi.addIndex('farms', ['organisation_id']);
	await qi.addIndex('farms', ['grower_id']);
	await qi.createTable('blocks', {
		id,
		organisation_id: fk('organisations'),
		farm_id: fk('farms'),
		crop_id: fk('crops', { onDelete: 'RESTRICT' }),
		pest_id: fk('pests', { onDelete: 'RESTRICT' }),
		name: { type: DataTypes.STRING(160), allowNull: false },
		variety: { type: DataTypes.STRING(120), allowNull: true },
		planting_date: { type: DataTypes.DATEONLY, allowNull: true },
		expected_harvest: { type: DataTypes.DATEONLY, allowNull: true },
		plants_per_ha: { type: DataTypes.DOUBLE, allowNull: false },
		area_ha: { type: DataTypes.DOUBLE, allowNull: false },
		boundary: { type: DataTypes.JSON, allowNull: true },
		centroid_lat: { type: DataTypes.DOUBLE, allowNull: false },
		centroid_lon: { type: DataTypes.DOUBLE, allowNull: false },
		min_lat: { type: DataTypes.DOUBLE, allowNull: false },
		min_lon: { type: DataTypes.DOUBLE, allowNull: false },
		max_lat: { type: DataTypes.DOUBLE, allowNull: false },
		max_lon: { type: DataTypes.DOUBLE, allowNull: false },
		rescout_days: { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 7 },
		expected_yield_kg_ha: { type: DataTypes.DOUBLE, allowNull: true },
		price_per_kg: { type: DataTypes.DOUBLE, allowNull: true },
		current_level: { type: DataTypes.ENUM(...LEVEL_KEYS), allowNull: true },
		current_reason: { type: DataTypes.STRING(300), allowNull: true },
		current_level_at: { type: DataTypes.DATE, allowNull: true },
		last_visit_on: { type: DataTypes.DATEONLY, allowNull: true },
		...timestamps
	});
	await qi.addIndex('blocks', ['organisation_id', 'current_level']);
	await qi.addIndex('blocks', ['farm_id']);
	await qi.addIndex('blocks', ['organisation_id', 'min_lat', 'min_lon']);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('blocks');
	await qi.dropTable('farms');
};
