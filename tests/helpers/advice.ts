// Test data for the agronomist's desk: an organisation of its own with a grower, an
// agronomist, a block under heavy pressure and one calm block. Counts are invented.
import { addDays, formatISO } from 'date-fns';
import {
	Crop,
	Pest,
	Product,
	Recommendation,
	SampleUnit,
	Visit,
	VisitCount
} from '../../src/lib/server/db/models';
import { reassessBlock } from '../../src/lib/server/assessments';
import { buildBlock, buildFarm, buildOrganisation, buildUser, testDb } from './db';

export const day = (offset: number) =>
	formatISO(addDays(new Date(), offset), { representation: 'date' });

async function visit(
	blockId: number,
	scoutId: number,
	ids: Ids,
	on: string,
	perPlant: number[],
	bbch: number
) {
	const v = await Visit.create({
		blockId,
		scoutId,
		pestId: ids.pestId,
		sampleUnitId: ids.unitId,
		visitedOn: on,
		positionSource: 'none',
		bbch,
		mode: 'count'
	});
	await VisitCount.bulkCreate(
		perPlant.map((aphids, i) => ({
			visitId: v.id,
			stopNo: i + 1,
			unitNo: 1,
			aphids,
			alate: 0,
			infested: aphids > 0
		}))
	);
}

interface Ids {
	cropId: number;
	pestId: number;
	unitId: number;
}

export async function soyIds(): Promise<Ids> {
	testDb();
	const [crop, pest, unit] = await Promise.all([
		Crop.findOne({ where: { code: 'soybean' } }),
		Pest.findOne({ where: { code: 'soybean-aphid' } }),
		SampleUnit.findOne({ where: { code: 'plant' } })
	]);
	return { cropId: crop!.id, pestId: pest!.id, unitId: unit!.id };
}

const plants = (mean: number) =>
	Array.from({ length: 20 }, (_, i) => Math.round(mean * (0.6 + (i % 5) * 0.2)));

/**
 * A fresh organisation: `hot` is far above the soybean threshold and rising, in bloom, with
 * harvest 10 days away and a 3A pyrethroid already applied this season; `mild` is calm.
 */
export async function deskScenario() {
	const org = await buildOrganisation();
	const agronomist = await buildUser('agronomist', org.id);
	const grower = await buildUser('grower', org.id);
	const otherGrower = await buildUser('grower', org.id);
	const scout = await buildUser('scout', org.id);
	const ids = await soyIds();
	const farm = await buildFarm(org.id, grower.user.id, { name: `Test farm ${org.slug}` });
	const otherFarm = await buildFarm(org.id, otherGrower.user.id);
	const common = {
		plantingDate: day(-90),
		rescoutDays: 7,
		expectedYieldKgHa: 3000,
		pricePerKg: 0.4
	};
	const hot = await buildBlock(farm, ids, {
		...common,
		name: `Hot block ${org.slug}`,
		expectedHarvest: day(10)
	});
	const mild = await buildBlock(farm, ids, {
		...common,
		name: `Mild block ${org.slug}`,
		expectedHarvest: day(60)
	});
	const other = await buildBlock(otherFarm, ids, {
		...common,
		name: `Other block ${org.slug}`,
		expectedHarvest: day(60)
	});
	for (const [offset, mean] of [
		[-15, 60],
		[-8, 220],
		[-1, 800]
	] as const)
		await visit(hot.id, scout.user.id, ids, day(offset), plants(mean), 64);
	for (const [offset, mean] of [
		[-9, 1],
		[-2, 1]
	] as const) {
		await visit(mild.id, scout.user.id, ids, day(offset), plants(mean), 64);
		await visit(other.id, scout.user.id, ids, day(offset), plants(mean), 64);
	}
	for (const b of [hot, mild, other]) await reassessBlock(b.id, { history: true, notify: false });
	const base = {
		organisationId: org.id,
		rateUnit: 'mL/ha',
		beeHazard: 'high' as const,
		notes: 'test values, not a label'
	};
	const earlier = await Product.create({
		...base,
		name: 'Test cyhalothrin',
		activeIngredient: 'lambda-cyhalothrin',
		iracGroup: '3A',
		rate: 40,
		reiHours: 24,
		phiDays: 30
	});
	const sameGroup = await Product.create({
		...base,
		name: 'Test bifenthrin',
		activeIngredient: 'bifenthrin',
		iracGroup: '3A',
		rate: 60,
		reiHours: 12,
		phiDays: 30
	});
	const otherGroup = await Product.create({
		...base,
		name: 'Test flonicamid',
		activeIngredient: 'flonicamid',
		iracGroup: '29',
		rate: 140,
		reiHours: 12,
		phiDays: 3,
		beeHazard: 'low'
	});
	await Recommendation.create({
		organisationId: org.id,
		blockId: hot.id,
		authorId: agronomist.user.id,
		decision: 'treat',
		productId: earlier.id,
		targetDate: day(-20),
		warnings: [],
		status: 'applied',
		issuedAt: new Date(),
		appliedOn: day(-20),
		appliedBy: 'Test contractor'
	});
	return {
		org,
		agronomist,
		grower,
		otherGrower,
		scout,
		farm,
		hot,
		mild,
		other,
		products: { earlier, sameGroup, otherGroup }
	};
}
