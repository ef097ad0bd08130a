import { QueryTypes, type InferCreationAttributes, type Transaction } from 'sequelize';
import type { AssessBlockInput, ThresholdRule as EngineRule } from '../engine';
import { Block } from './db/models';

// The engine's input for one block, read as plain rows: building model instances for a season
// of counts cost several times the engine run itself, and every visit filed pays for it.

function select<T extends object>(sql: string, replacements: unknown[], transaction?: Transaction) {
	return Block.sequelize!.query<T>(sql, { replacements, type: QueryTypes.SELECT, transaction });
}

/** The block columns the engine and the alerts read, under the model's attribute names. */
const BLOCK_COLUMNS = `id, organisation_id AS organisationId, farm_id AS farmId, crop_id AS cropId,
	pest_id AS pestId, name, area_ha AS areaHa, plants_per_ha AS plantsPerHa,
	expected_yield_kg_ha AS expectedYieldKgHa, price_per_kg AS pricePerKg,
	rescout_days AS rescoutDays, current_level AS currentLevel`;

type RuleRow = Omit<EngineRule, 'cropCode' | 'pestCode' | 'requiresRising'> & {
	organisationId: number | null;
	requiresRising: number | boolean;
	tallyThreshold: number | null;
	injury: number | null;
	alsoProportion: number | null;
};

/** Threshold rules for a crop and pest: the organisation's own where it has any, else the library's. */
export async function rulesFor(
	organisationId: number,
	cropId: number,
	pestId: number,
	transaction?: Transaction
): Promise<Omit<EngineRule, 'cropCode' | 'pestCode'>[]> {
	const rows = await select<RuleRow>(
		`SELECT r.organisation_id AS organisationId, r.bbch_from AS bbchFrom, r.bbch_to AS bbchTo,
		   COALESCE(u.code, '') AS sampleUnit, r.metric, r.tally_threshold AS tallyThreshold,
		   r.action, r.injury, r.requires_rising AS requiresRising,
		   r.also_proportion AS alsoProportion, r.label, r.source, r.provenance
		 FROM threshold_rules r LEFT JOIN sample_units u ON u.id = r.sample_unit_id
		 WHERE r.crop_id = ? AND r.pest_id = ? AND r.active = 1
		   AND (r.organisation_id = ? OR r.organisation_id IS NULL)
		 ORDER BY r.id`,
		[cropId, pestId, organisationId],
		transaction
	);
	const own = rows.filter((r) => r.organisationId === organisationId);
	return (own.length ? own : rows).map((r) => ({
		bbchFrom: r.bbchFrom,
		bbchTo: r.bbchTo,
		sampleUnit: r.sampleUnit,
		metric: r.metric,
		tallyThreshold: r.tallyThreshold ?? undefined,
		action: r.action,
		injury: r.injury ?? undefined,
		requiresRising: !!r.requiresRising,
		alsoProportion: r.alsoProportion ?? undefined,
		label: r.label,
		source: r.source,
		provenance: r.provenance
	}));
}

interface VisitRow {
	id: number;
	visitedOn: string;
	bbch: number | null;
	sampleUnitId: number;
	mode: 'count' | 'presence';
	mummies: number;
	ladybeetles: number;
	lacewings: number;
	hoverflies: number;
	otherPredators: number;
	/** "aphids:alate:infested" per unit, in stop and unit order, comma-separated; '' for NULL. */
	units: string | null;
}

/**
 * A block's visits up to `asOf`, oldest first, each with its counts in stop and unit order.
 * The counts come packed into one string per visit: a row per count (hundreds per block)
 * cost more to decode than the engine run. GROUP_CONCAT's 1 MB default limit holds a visit's
 * at most 2,000 units (about 32 KB) many times over.
 */
async function visitsWithCounts(blockId: number, asOf: string, transaction?: Transaction) {
	const rows = await select<VisitRow>(
		`SELECT v.id, v.visited_on AS visitedOn, v.bbch, v.sample_unit_id AS sampleUnitId, v.mode,
		   v.mummies, v.ladybeetles, v.lacewings, v.hoverflies, v.other_predators AS otherPredators,
		   (SELECT GROUP_CONCAT(CONCAT(IFNULL(c.aphids, ''), ':', IFNULL(c.alate, ''), ':', c.infested)
		      ORDER BY c.stop_no, c.unit_no SEPARATOR ',')
		    FROM visit_counts c WHERE c.visit_id = v.id) AS units
		 FROM visits v WHERE v.block_id = ? AND v.visited_on <= ? ORDER BY v.visited_on, v.id`,
		[blockId, asOf],
		transaction
	);
	return rows.map((v) => ({
		...v,
		counts: v.units
			? v.units.split(',').map((u) => {
					const [aphids, alate, infested] = u.split(':');
					return {
						aphids: aphids === '' ? null : Number(aphids),
						alate: alate === '' ? null : Number(alate),
						infested: infested === '1'
					};
				})
			: []
	}));
}

type BlockRow = Pick<
	Block,
	| 'id'
	| 'organisationId'
	| 'farmId'
	| 'cropId'
	| 'pestId'
	| 'name'
	| 'areaHa'
	| 'plantsPerHa'
	| 'expectedYieldKgHa'
	| 'pricePerKg'
	| 'rescoutDays'
	| 'currentLevel'
>;

/** Everything the engine needs for one block, in a handful of plain queries. */
export async function engineInput(blockId: number, asOf: string, transaction?: Transaction) {
	const [row] = await select<BlockRow>(
		`SELECT ${BLOCK_COLUMNS} FROM blocks WHERE id = ?`,
		[blockId],
		transaction
	);
	if (!row) throw new Error(`Block ${blockId} not found`);
	const [[library], rules, units, visits, weather] = await Promise.all([
		select<{ cropCode: string; cropParams: string; pestCode: string; pestParams: string }>(
			`SELECT c.code AS cropCode, c.params AS cropParams, p.code AS pestCode, p.params AS pestParams
			 FROM crops c, pests p WHERE c.id = ? AND p.id = ?`,
			[row.cropId, row.pestId],
			transaction
		),
		rulesFor(row.organisationId, row.cropId, row.pestId, transaction),
		select<{ id: number; code: string; unitsPerPlant: number | null }>(
			`SELECT id, code, units_per_plant_default AS unitsPerPlant FROM sample_units`,
			[],
			transaction
		),
		visitsWithCounts(blockId, asOf, transaction),
		select<{ date: string; tminC: number; tmaxC: number }>(
			`SELECT day AS date, tmin_c AS tminC, tmax_c AS tmaxC FROM weather_days
			 WHERE farm_id = ? ORDER BY day`,
			[row.farmId],
			transaction
		)
	]);
	const unitCode = new Map(units.map((u) => [u.id, u.code]));
	const last = visits[visits.length - 1];
	const unitsPerPlant = last ? units.find((u) => u.id === last.sampleUnitId)?.unitsPerPlant : null;
	const input: AssessBlockInput = {
		asOf,
		crop: json<AssessBlockInput['crop']>(library.cropParams),
		pest: json<AssessBlockInput['pest']>(library.pestParams),
		thresholds: rules.map((r) => ({
			...r,
			cropCode: library.cropCode,
			pestCode: library.pestCode
		})),
		block: {
			areaHa: row.areaHa,
			plantsPerHa: row.plantsPerHa,
			unitsPerPlant: unitsPerPlant ?? undefined,
			expectedYieldKgHa: row.expectedYieldKgHa ?? undefined,
			pricePerKg: row.pricePerKg ?? undefined,
			rescoutDays: row.rescoutDays
		},
		visits: visits.map((v) => ({
			id: v.id,
			date: v.visitedOn,
			bbch: v.bbch ?? undefined,
			sampleUnit: unitCode.get(v.sampleUnitId) ?? '',
			units: v.counts.map((c) =>
				v.mode === 'presence'
					? { infested: c.infested }
					: { aphids: c.aphids ?? 0, alate: c.alate ?? undefined }
			),
			mummies: v.mummies,
			predators: {
				ladybeetle: v.ladybeetles,
				lacewing: v.lacewings,
				hoverfly: v.hoverflies,
				other: v.otherPredators
			}
		})),
		weather
	};
	const block = Block.build(row as unknown as InferCreationAttributes<Block>, {
		isNewRecord: false,
		raw: true
	});
	return { block, input, visitIds: visits.map((v) => v.id) };
}

/** JSON columns come back parsed from the model layer, as text from a plain query. */
export function json<T>(v: string | T): T {
	return typeof v === 'string' ? (JSON.parse(v) as T) : v;
}
