import { randomUUID } from 'node:crypto';
import { hash } from '@node-rs/argon2';
import type { Sequelize } from 'sequelize';
import { db } from '../../src/lib/server/db';
import { Block, Farm, Membership, Organisation, User } from '../../src/lib/server/db/models';
import type { Role } from '../../src/lib/roles';

let sequelize: Sequelize | null = null;

/**
 * The test database that `npm test` created, migrated and seeded, through the app's own
 * connection, so server code called from a test shares it (models bind to one instance).
 */
export function testDb(): Sequelize {
	if (!sequelize) {
		if (!process.env.DATABASE_URL)
			throw new Error('DATABASE_URL is not set: run the tests through `npm test`');
		sequelize = db();
	}
	return sequelize;
}

export async function closeTestDb() {
	await sequelize?.close();
	sequelize = null;
}

const uniq = () => randomUUID().slice(0, 8);

/** Small factories; each call makes rows of its own so tests never collide. */
export async function buildOrganisation(overrides: Partial<Organisation> = {}) {
	testDb();
	const s = uniq();
	return Organisation.create({
		name: `Test org ${s}`,
		slug: `test-${s}`,
		kind: 'advisory',
		region: 'Test region',
		...overrides
	});
}

export async function buildUser(role: Role, organisationId: number, password = 'test-password-1') {
	testDb();
	const s = uniq();
	const user = await User.create({
		name: `Test ${role} ${s}`,
		email: `${role}-${s}@example.test`,
		passwordHash: await hash(password)
	});
	await Membership.create({ userId: user.id, organisationId, role });
	return { user, password };
}

export async function buildFarm(
	organisationId: number,
	growerId: number,
	overrides: Partial<Farm> = {}
) {
	testDb();
	return Farm.create({
		organisationId,
		growerId,
		name: `Farm ${uniq()}`,
		lat: 47.2,
		lon: -96.9,
		...overrides
	});
}

export async function buildBlock(
	farm: Farm,
	ids: { cropId: number; pestId: number },
	overrides: Partial<Block> = {}
) {
	testDb();
	const ring: [number, number][] = [
		[farm.lon, farm.lat],
		[farm.lon + 0.01, farm.lat],
		[farm.lon + 0.01, farm.lat + 0.005],
		[farm.lon, farm.lat + 0.005],
		[farm.lon, farm.lat]
	];
	return Block.create({
		organisationId: farm.organisationId,
		farmId: farm.id,
		cropId: ids.cropId,
		pestId: ids.pestId,
		name: `Block ${uniq()}`,
		plantsPerHa: 350_000,
		areaHa: 42,
		boundary: { type: 'Polygon', coordinates: [ring] },
		centroidLat: farm.lat + 0.0025,
		centroidLon: farm.lon + 0.005,
		minLat: farm.lat,
		minLon: farm.lon,
		maxLat: farm.lat + 0.005,
		maxLon: farm.lon + 0.01,
		...overrides
	});
}
