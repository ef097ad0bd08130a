import { hash } from '@node-rs/argon2';
import { addDays, subDays } from 'date-fns';
import type { Sequelize } from 'sequelize';
import { measurePolygon } from '../../../geo/measure';
import { reassessBlock } from '../../assessments';
import {
	Block,
	Farm,
	Membership,
	Organisation,
	Product,
	ScoutingAssignment,
	Subscription,
	Trap,
	TrapReading,
	User,
	Visit,
	VisitCount,
	WeatherDay
} from '../models';
import { DEMO_PASSWORD, DEMO_PEOPLE } from './demo-people';
import { blockRing, FARMS, REGION } from './demo-scenario';
import { DEMO_PLANS, demoVisits, isoDay } from './demo-visits';
import { DEMO_PRODUCTS } from './demo-products';
import { seedLibrary } from './library';
import { rng } from './random';

const ORGS = {
	brackenridge: { name: 'Brackenridge Crop Advisory', slug: 'brackenridge', kind: 'advisory' },
	ostrander: { name: 'Ostrander Growers Co-op', slug: 'ostrander', kind: 'coop' },
	extension: {
		name: 'Willowmere Extension District',
		slug: 'willowmere-extension',
		kind: 'extension'
	}
} as const;

/**
 * Seeds the parameter library and the demo scenario (idempotent: a second run finds the demo
 * organisation and changes nothing). Dates are relative to today so the screens always show a
 * season in progress. Returns a one-line summary.
 */
export async function seedDemo(sequelize: Sequelize, today = new Date()): Promise<string> {
	const exists = await Organisation.findOne({ where: { slug: ORGS.brackenridge.slug } });
	if (exists) {
		await sequelize.transaction((t) => seedLibrary(t));
		return 'already present';
	}
	const r = rng(20260601);
	const passwordHash = await hash(DEMO_PASSWORD);
	const blockIds: number[] = [];
	let visits = 0;

	await sequelize.transaction(async (transaction) => {
		const lib = await seedLibrary(transaction);
		const orgId: Record<string, number> = {};
		for (const [key, o] of Object.entries(ORGS)) {
			const row = await Organisation.create(
				{ ...o, region: REGION, timezone: 'America/Chicago' },
				{ transaction }
			);
			orgId[key] = row.id;
		}
		const userId: Record<string, number> = {};
		for (const p of DEMO_PEOPLE) {
			const u = await User.create(
				{ name: p.name, email: p.email, passwordHash, phoneE164: p.phone ?? null },
				{ transaction }
			);
			userId[p.key] = u.id;
			await Membership.create(
				{ userId: u.id, organisationId: orgId[p.org], role: p.role },
				{ transaction }
			);
		}
		for (const [org, products] of Object.entries(DEMO_PRODUCTS)) {
			await Product.bulkCreate(
				products.map((p) => ({ ...p, organisationId: orgId[org] })),
				{ transaction }
			);
		}

		const seasonStart = subDays(today, 54);
		for (const farm of FARMS) {
			const f = await Farm.create(
				{
					organisationId: orgId[farm.org],
					growerId: userId[farm.grower],
					name: farm.name,
					locality: farm.locality,
					lat: farm.lat,
					lon: farm.lon
				},
				{ transaction }
			);
			await WeatherDay.bulkCreate(
				Array.from({ length: 70 }, (_, d) => {
					const mid = 20 + 4 * Math.sin((d / 70) * Math.PI) + r.normal() * 1.5;
					const half = 5 + r.next() * 3;
					return {
						farmId: f.id,
						day: isoDay(addDays(seasonStart, d - 7)),
						tminC: Math.round((mid - half) * 10) / 10,
						tmaxC: Math.round((mid + half) * 10) / 10,
						source: 'seed' as const
					};
				}),
				{ transaction }
			);
			const trap = await Trap.create(
				{
					organisationId: orgId[farm.org],
					farmId: f.id,
					name: `${farm.name.split(' ')[0]} yellow card`,
					kind: 'yellow-sticky',
					lat: farm.lat + 0.002,
					lon: farm.lon - 0.003,
					installedOn: isoDay(subDays(seasonStart, 7))
				},
				{ transaction }
			);
			const scoutKey = farm.blocks[0].scout;
			await TrapReading.bulkCreate(
				Array.from({ length: 8 }, (_, w) => {
					const soybean = r.poisson(0.5 + w * w * 0.6);
					const other = r.poisson(1 + w * 0.5);
					return {
						trapId: trap.id,
						scoutId: userId[scoutKey],
						readOn: isoDay(addDays(seasonStart, w * 7 + 1)),
						daysOut: 7,
						alateCounts: { 'soybean aphid': soybean, 'other aphids': other },
						alateTotal: soybean + other,
						cardChanged: true
					};
				}),
				{ transaction }
			);

			for (const b of farm.blocks) {
				const ring = blockRing(farm, b);
				const boundary = { type: 'Polygon' as const, coordinates: [ring] };
				const m = measurePolygon(boundary);
				const plan = DEMO_PLANS[b.crop];
				const block = await Block.create(
					{
						organisationId: orgId[farm.org],
						farmId: f.id,
						cropId: lib.crops.get(b.crop)!,
						pestId: lib.pests.get(b.pest)!,
						name: b.name,
						variety: b.variety,
						plantingDate: isoDay(subDays(today, 100)),
						expectedHarvest: isoDay(addDays(today, 40 + r.int(0, 20))),
						plantsPerHa: b.plantsPerHa,
						areaHa: Math.round(m.areaHa * 100) / 100,
						boundary,
						centroidLat: m.centroidLat,
						centroidLon: m.centroidLon,
						minLat: m.minLat,
						minLon: m.minLon,
						maxLat: m.maxLat,
						maxLon: m.maxLon,
						rescoutDays: 7,
						expectedYieldKgHa: b.yieldKgHa,
						pricePerKg: b.pricePerKg
					},
					{ transaction }
				);
				blockIds.push(block.id);
				await ScoutingAssignment.create(
					{ blockId: block.id, scoutId: userId[b.scout], assignedBy: null, intervalDays: 7 },
					{ transaction }
				);
				// Some blocks are overdue (last visit 9+ days ago), most were seen this week.
				const offset = r.int(0, 4);
				const n = b.name === 'South Soy' ? 6 : 8;
				for (const v of demoVisits(
					r,
					b.crop,
					b.start,
					b.growth,
					addDays(seasonStart, offset),
					n,
					7
				)) {
					const visit = await Visit.create(
						{
							blockId: block.id,
							scoutId: userId[b.scout],
							pestId: lib.pests.get(b.pest)!,
							sampleUnitId: lib.units.get(plan.unit)!,
							visitedOn: v.visitedOn,
							lat: m.centroidLat,
							lon: m.centroidLon,
							positionSource: 'gps',
							bbch: v.bbch,
							airTempC: v.airTempC,
							mode: 'count',
							mummies: v.mummies,
							ladybeetles: v.ladybeetles,
							lacewings: v.lacewings,
							hoverflies: v.hoverflies
						},
						{ transaction }
					);
					await VisitCount.bulkCreate(
						v.counts.map((c) => ({ ...c, visitId: visit.id, infested: c.aphids > 0 })),
						{ transaction }
					);
					visits++;
				}
			}
		}
		for (const key of ['grower1', 'grower2', 'agronomist']) {
			await Subscription.bulkCreate(
				[
					{
						userId: userId[key],
						channel: 'sms',
						minLevel: 'action',
						quietStart: '21:00',
						quietEnd: '06:30'
					},
					{ userId: userId[key], channel: 'email', minLevel: 'stirring' }
				],
				{ transaction }
			);
		}
	});

	for (const id of blockIds) await reassessBlock(id, { today, history: true, notify: false });
	return `${FARMS.length} farms, ${blockIds.length} blocks, ${visits} visits, ${DEMO_PEOPLE.length} people`;
}
