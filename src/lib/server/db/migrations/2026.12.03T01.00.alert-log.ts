import { DataTypes } from 'sequelize';
import type { Migration } from '../migrator';

// The alert log filters an organisation's messages by state or kind, newest first: each filter
// gets an index that reads rows already in that order, so a page stays one short range scan
// however many messages the organisation has. The organisation's country (ISO 3166-1 alpha-2)
// is the default for phone numbers typed without a + and a country code.
export const up: Migration = async ({ context: qi }) => {
	await qi.addIndex('notifications', ['organisation_id', 'status', 'created_at'], {
		name: 'notifications_org_status_created'
	});
	await qi.addIndex('notifications', ['organisation_id', 'kind', 'created_at'], {
		name: 'notifications_org_kind_created'
	});
	await qi.addColumn('organisations', 'country', {
		type: DataTypes.CHAR(2),
		allowNull: false,
		defaultValue: 'US'
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.removeColumn('organisations', 'country');
	await qi.removeIndex('notifications', 'notifications_org_kind_created');
	await qi.removeIndex('notifications', 'notifications_org_status_created');
};
