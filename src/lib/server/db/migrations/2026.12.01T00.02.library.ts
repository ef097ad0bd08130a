import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';
import { fk, id, timestamps } from './helpers';

export const PROVENANCE = ['published', 'computed', 'from memory', 'common practice', 'assumption'];

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('crops', {
		id,
		code: { type: DataTypes.STRING(40), allowNull: false, unique: true },
		name: { type: DataTypes.STRING(120), allowNull: false },
		params: { type: DataTypes.JSON, allowNull: false },
		...timestamps
	});
	await qi.createTable('pests', {
		id,
		code: { type: DataTypes.STRING(40), allowNull: false, unique: true },
		name: { type: DataTypes.STRING(120), allowNull: false },
		scientific_name: { type: DataTypes.STRING(160), allowNull: false },
		params: { type: DataTypes.JSON, allowNull: false },
		...timestamps
	});
	await qi.createTable('sample_units', {
		id,
		code: { type: DataTypes.STRING(40), allowNull: false, unique: true },
		name: { type: DataTypes.STRING(120), allowNull: false },
		units_per_plant_default: { type: DataTypes.DOUBLE, allowNull: true },
		...timestamps
	});
	await qi.createTable('threshold_rules', {
		id,
		organisation_id: fk('organisations', { allowNull: true, onDelete: 'CASCADE' }),
		crop_id: fk('crops'),
		pest_id: fk('pests'),
		sample_unit_id: fk('sample_units', { onDelete: 'RESTRICT' }),
		bbch_from: { type: DataTypes.SMALLINT, allowNull: false },
		bbch_to: { type: DataTypes.SMALLINT, allowNull: false },
		metric: { type: DataTypes.ENUM('mean', 'proportion'), allowNull: false },
		tally_threshold: { type: DataTypes.SMALLINT, allowNull: true },
		action: { type: DataTypes.DOUBLE, allowNull: false },
		injury: { type: DataTypes.DOUBLE, allowNull: true },
		requires_rising: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
		also_proportion: { type: DataTypes.DOUBLE, allowNull: true },
		label: { type: DataTypes.STRING(200), allowNull: false },
		source: { type: DataTypes.STRING(500), allowNull: false },
		provenance: { type: DataTypes.ENUM(...PROVENANCE), allowNull: false },
		active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
		...timestamps
	});
	await qi.addIndex('threshold_rules', ['crop_id', 'pest_id', 'bbch_from']);
};

export const down: Migration = async ({ context: qi }) => {
	for (const t of ['threshold_rules', 'sample_units', 'pests', 'crops']) await qi.dropTable(t);
};
