import { Umzug, SequelizeStorage, type MigrationFn } from 'umzug';
import type { QueryInterface, Sequelize } from 'sequelize';
import * as m01 from './migrations/2026.12.01T00.01.core';
import * as m02 from './migrations/2026.12.01T00.02.library';
import * as m03 from './migrations/2026.12.01T00.03.farms';
import * as m04 from './migrations/2026.12.01T00.04.scouting';
import * as m05 from './migrations/2026.12.01T00.05.advice';
import * as m06 from './migrations/2026.12.01T00.06.alerts';
import * as m07 from './migrations/2026.12.01T00.07.audit';
import * as m0201 from './migrations/2026.12.02T01.00.scouting-extras';
import * as m0301 from './migrations/2026.12.03T01.00.alert-log';

export type Migration = MigrationFn<QueryInterface>;

// Listed explicitly (not globbed) so they run the same under Vite, Vitest, tsx and the build.
const MIGRATIONS: Record<string, { up: Migration; down: Migration }> = {
	'2026.12.01T00.01.core': m01,
	'2026.12.01T00.02.library': m02,
	'2026.12.01T00.03.farms': m03,
	'2026.12.01T00.04.scouting': m04,
	'2026.12.01T00.05.advice': m05,
	'2026.12.01T00.06.alerts': m06,
	'2026.12.01T00.07.audit': m07,
	'2026.12.02T01.00.scouting-extras': m0201,
	'2026.12.03T01.00.alert-log': m0301
};

/** An umzug instance over the project's migrations, recording progress in `schema_migrations`. */
export function migrator(sequelize: Sequelize, log = false) {
	return new Umzug({
		migrations: Object.entries(MIGRATIONS).map(([name, m]) => ({ name, up: m.up, down: m.down })),
		context: sequelize.getQueryInterface(),
		storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
		logger: log ? console : undefined
	});
}
