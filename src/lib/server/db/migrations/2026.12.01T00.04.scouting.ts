import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';
import { fk, id, timestamps } from './helpers';

export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('scouting_assignments', {
		id,
		block_id: fk('blocks'),
		scout_id: fk('users'),
		assigned_by: fk('users', { allowNull: true }),
		interval_days: { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 7 },
		active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
		...timestamps
	});
	await qi.addIndex('scouting_assignments', ['block_id', 'scout_id'], { unique: true });
	await qi.addIndex('scouting_assignments', ['scout_id', 'active']);

	await qi.createTable('visits', {
		id,
		block_id: fk('blocks'),
		scout_id: fk('users', { onDelete: 'RESTRICT' }),
		pest_id: fk('pests', { onDelete: 'RESTRICT' }),
		sample_unit_id: fk('sample_units', { onDelete: 'RESTRICT' }),
		client_key: { type: DataTypes.STRING(64), allowNull: true, unique: true },
		visited_on: { type: DataTypes.DATEONLY, allowNull: false },
		started_at: { type: DataTypes.DATE, allowNull: true },
		lat: { type: DataTypes.DOUBLE, allowNull: true },
		lon: { type: DataTypes.DOUBLE, allowNull: true },
		position_source: { type: DataTypes.ENUM('gps', 'manual', 'none'), allowNull: false },
		outside_boundary: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
		bbch: { type: DataTypes.SMALLINT, allowNull: true },
		air_temp_c: { type: DataTypes.DOUBLE, allowNull: true },
		mode: { type: DataTypes.ENUM('count', 'presence'), allowNull: false },
		tally_threshold: { type: DataTypes.SMALLINT, allowNull: true },
		mummies: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
		ladybeetles: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
		lacewings: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
		hoverflies: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
		other_predators: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
		notes: { type: DataTypes.TEXT, allowNull: true },
		...timestamps
	});
	await qi.addIndex('visits', ['block_id', 'visited_on']);
	await qi.addIndex('visits', ['scout_id', 'visited_on']);

	await qi.createTable('visit_counts', {
		id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
		visit_id: fk('visits'),
		stop_no: { type: DataTypes.SMALLINT, allowNull: false },
		unit_no: { type: DataTypes.SMALLINT, allowNull: false },
		aphids: { type: DataTypes.INTEGER, allowNull: true },
		alate: { type: DataTypes.INTEGER, allowNull: true },
		infested: { type: DataTypes.BOOLEAN, allowNull: false }
	});
	await qi.addIndex('visit_counts', ['visit_id', 'stop_no', 'unit_no'], { unique: true });

	await qi.createTable('traps', {
		id,
		organisation_id: fk('organisations'),
		farm_id: fk('farms'),
		name: { type: DataTypes.STRING(120), allowNull: false },
		kind: { type: DataTypes.ENUM('yellow-sticky', 'water-pan', 'suction'), allowNull: false },
		lat: { type: DataTypes.DOUBLE, allowNull: false },
		lon: { type: DataTypes.DOUBLE, allowNull: false },
		active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
		installed_on: { type: DataTypes.DATEONLY, allowNull: true },
		...timestamps
	});
	await qi.addIndex('traps', ['organisation_id']);
	await qi.addIndex('traps', ['farm_id']);

	await qi.createTable('trap_readings', {
		id,
		trap_id: fk('traps'),
		scout_id: fk('users', { onDelete: 'RESTRICT' }),
		client_key: { type: DataTypes.STRING(64), allowNull: true, unique: true },
		read_on: { type: DataTypes.DATEONLY, allowNull: false },
		days_out: { type: DataTypes.SMALLINT, allowNull: false },
		alate_counts: { type: DataTypes.JSON, allowNull: false },
		alate_total: { type: DataTypes.INTEGER, allowNull: false },
		card_changed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
		notes: { type: DataTypes.TEXT, allowNull: true },
		...timestamps
	});
	await qi.addIndex('trap_readings', ['trap_id', 'read_on']);

	await qi.createTable('photos', {
		id,
		organisation_id: fk('organisations'),
		block_id: fk('blocks', { allowNull: true, onDelete: 'CASCADE' }),
		visit_id: fk('visits', { allowNull: true, onDelete: 'CASCADE' }),
		trap_reading_id: fk('trap_readings', { allowNull: true, onDelete: 'CASCADE' }),
		uploaded_by: fk('users', { onDelete: 'RESTRICT' }),
		storage_key: { type: DataTypes.STRING(200), allowNull: false, unique: true },
		thumb_key: { type: DataTypes.STRING(200), allowNull: false },
		mime: { type: DataTypes.STRING(60), allowNull: false },
		bytes: { type: DataTypes.INTEGER, allowNull: false },
		width: { type: DataTypes.INTEGER, allowNull: false },
		height: { type: DataTypes.INTEGER, allowNull: false },
		sha256: { type: DataTypes.CHAR(64), allowNull: false },
		caption: { type: DataTypes.STRING(300), allowNull: true },
		...timestamps
	});
	await qi.addIndex('photos', ['visit_id']);
	await qi.addIndex('photos', ['block_id']);

	await qi.createTable('weather_days', {
		id,
		farm_id: fk('farms'),
		day: { type: DataTypes.DATEONLY, allowNull: false },
		tmin_c: { type: DataTypes.DOUBLE, allowNull: false },
		tmax_c: { type: DataTypes.DOUBLE, allowNull: false },
		source: { type: DataTypes.ENUM('manual', 'station-csv', 'seed'), allowNull: false },
		...timestamps
	});
	await qi.addIndex('weather_days', ['farm_id', 'day'], { unique: true });
};

export const down: Migration = async ({ context: qi }) => {
	for (const t of [
		'weather_days',
		'photos',
		'trap_readings',
		'traps',
		'visit_counts',
		'visits',
		'scouting_assignments'
	])
		await qi.dropTable(t);
};
