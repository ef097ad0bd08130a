import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';
import { fk, id, timestamps } from './helpers';
import { LEVEL_KEYS } from './2026.12.01T00.03.farms';

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('assessments', {
		id,
		block_id: fk('blocks'),
		visit_id: fk('visits', { allowNull: true, onDelete: 'CASCADE' }),
		computed_at: { type: DataTypes.DATE(3), allowNull: false },
		level: { type: DataTypes.ENUM(...LEVEL_KEYS), allowNull: false },
		reason: { type: DataTypes.STRING(300), allowNull: false },
		inputs: { type: DataTypes.JSON, allowNull: false },
		result: { type: DataTypes.JSON, allowNull: false }
	});
	await qi.addIndex('assessments', ['block_id', 'computed_at']);

	await qi.createTable('products', {
		id,
		organisation_id: fk('organisations'),
		name: { type: DataTypes.STRING(160), allowNull: false },
		active_ingredient: { type: DataTypes.STRING(200), allowNull: false },
		irac_group: { type: DataTypes.STRING(8), allowNull: false },
		rate: { type: DataTypes.DOUBLE, allowNull: false },
		rate_unit: { type: DataTypes.STRING(40), allowNull: false },
		rei_hours: { type: DataTypes.SMALLINT, allowNull: false },
		phi_days: { type: DataTypes.SMALLINT, allowNull: false },
		bee_hazard: { type: DataTypes.ENUM('low', 'moderate', 'high'), allowNull: false },
		notes: { type: DataTypes.TEXT, allowNull: true },
		active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
		...timestamps
	});
	await qi.addIndex('products', ['organisation_id', 'name'], { unique: true });

	await qi.createTable('recommendations', {
		id,
		organisation_id: fk('organisations'),
		block_id: fk('blocks'),
		assessment_id: fk('assessments', { allowNull: true }),
		author_id: fk('users', { onDelete: 'RESTRICT' }),
		decision: {
			type: DataTypes.ENUM('treat', 'rescout', 'no-action', 'biological', 'other'),
			allowNull: false
		},
		product_id: fk('products', { allowNull: true, onDelete: 'RESTRICT' }),
		target_date: { type: DataTypes.DATEONLY, allowNull: true },
		rescout_by: { type: DataTypes.DATEONLY, allowNull: true },
		notes: { type: DataTypes.TEXT, allowNull: true },
		warnings: { type: DataTypes.JSON, allowNull: false },
		status: {
			type: DataTypes.ENUM('draft', 'issued', 'acknowledged', 'applied', 'withdrawn'),
			allowNull: false,
			defaultValue: 'draft'
		},
		issued_at: { type: DataTypes.DATE, allowNull: true },
		acknowledged_at: { type: DataTypes.DATE, allowNull: true },
		acknowledged_by: fk('users', { allowNull: true }),
		applied_on: { type: DataTypes.DATEONLY, allowNull: true },
		applied_by: { type: DataTypes.STRING(160), allowNull: true },
		follow_up_due: { type: DataTypes.DATEONLY, allowNull: true },
		...timestamps
	});
	await qi.addIndex('recommendations', ['block_id', 'status']);
	await qi.addIndex('recommendations', ['organisation_id', 'status']);
};

export const down: Migration = async ({ context: qi }) => {
	for (const t of ['recommendations', 'products', 'assessments']) await qi.dropTable(t);
};
