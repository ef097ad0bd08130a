import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

// How a visit reached the server and which sampling plan the scout followed, so a visit from a
// spreadsheet or the API can be told apart from one tallied on a phone.
export const up: Migration = async ({ context: qi }) => {
	await qi.addColumn('visits', 'entry_channel', {
		type: DataTypes.ENUM('phone', 'api', 'csv'),
		allowNull: false,
		defaultValue: 'api'
	});
	await qi.addColumn('visits', 'sampling_plan', { type: DataTypes.STRING(40), allowNull: true });
	await qi.addColumn('visits', 'plan_decision', { type: DataTypes.STRING(200), allowNull: true });
	// A retried upload of the same picture by the same person finds the first copy.
	await qi.addIndex('photos', ['uploaded_by', 'sha256']);
};

export const down: Migration = async ({ context: qi }) => {
	// MariaDB lets the uploaded_by foreign key use the composite index; give it its own first.
	await qi.addIndex('photos', ['uploaded_by']);
	await qi.removeIndex('photos', ['uploaded_by', 'sha256']);
	await qi.removeColumn('visits', 'plan_decision');
	await qi.removeColumn('visits', 'sampling_plan');
	await qi.removeColumn('visits', 'entry_channel');
};
