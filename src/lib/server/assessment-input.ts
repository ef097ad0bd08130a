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

const RULE_COLUMNS = `r.organisation_id AS organisationId, r.crop_id AS cropId, r.pest_id AS pestId,
	r.bbch_from AS bbchFrom, r.bbch_to AS bbchTo, COALESCE(u.code, '') AS sampleUnit, r.metric,
	r.tally_threshold AS tallyThreshold, r.action, r.injury, r.requires_rising AS requiresRising,
	r.also_proportion AS alsoProportion, r.label, r.source, r.provenance`;

/** The rules that apply to one organisation: its own where it has any, else the library's. */
function applicable(
	rows: (RuleRow & { cropId?: number; pestId?: number })[],
	organisationId: number
) {
	const own = rows.filter((r) => r.organisationId === organisationId);
	return (own.length ? own : rows.filter((r) => r.organisationId === null)).map((r) => ({
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

/** Threshold rules for a crop and pest: the organisation's own where it has any, else the library's. */
export async function rulesFor(
	organisationId: number,
	cropId: number,
	pestId: number,
	transaction?: Transaction
): Promise<Omit<EngineRule, 'cropCode' | 'pestCode'>[]> {
	const rows = await select<RuleRow>(
		`SELECT ${RULE_COLUMNS}
		 FROM threshold_rules r LEFT JOIN sample_units u ON u.id = r.sample_unit_id
		 WHERE r.crop_id = ? AND r.pest_id = ? AND r.active = 1
		   AND (r.organisation_id = ? OR r.organisation_id IS NULL)
		 ORDER BY r.id`,
		[cropId, pestId, organisationId],
		transaction
	);
	return applicable(rows, organisationId);
}

interface VisitRow {
	id: number;
	blockId: number;
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
async function visitsWithCounts(
	where:
		| { blockIds: number[]; asOf?: string }
		| { ids: number[] }
		| { after: { blockId: number; id: number }[] },
	transaction?: Transaction
) {
	let filter: string;
	let params: unknown[];
	if ('ids' in where) [filter, params] = ['v.id IN (?)', [where.ids]];
	else if ('after' in where) {
		filter = where.after.map(() => '(v.block_id = ? AND v.id > ?)').join(' OR ');
		params = where.after.flatMap((a) => [a.blockId, a.id]);
	} else if (where.asOf !== undefined) {
		[filter, params] = ['v.block_id IN (?) AND v.visited_on <= ?', [where.blockIds, where.asOf]];
	} else [filter, params] = ['v.block_id IN (?)', [where.blockIds]];
	const rows = await select<VisitRow>(
		`SELECT v.id, v.block_id AS blockId, v.visited_on AS visitedOn, v.bbch, v.sample_unit_id AS sampleUnitId, v.mode,
		   v.mummies, v.ladybeetles, v.lacewings, v.hoverflies, v.other_predators AS otherPredators,
		   (SELECT GROUP_CONCAT(CONCAT(IFNULL(c.aphids, ''), ':', IFNULL(c.alate, ''), ':', c.infested)
		      ORDER BY c.stop_no, c.unit_no SEPARATOR ',')
		    FROM visit_counts c WHERE c.visit_id = v.id) AS units
		 FROM visits v WHERE ${filter}
		 ORDER BY v.block_id, v.visited_on, v.id`,
		params,
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

type ReadVisit = Awaited<ReturnType<typeof visitsWithCounts>>[number];

/**
 * Blocks' visits as read before, kept per block with the fingerprint they were read under
 * (count, sum and largest of the ids). Visits are never changed once filed, so when the
 * fingerprint in MariaDB is unchanged the kept visits are exactly the stored ones; when only
 * newer ids were added, just those are read (and the sum must then match, else the block is
 * read again in full). The visit batch uses this, so each batch reads the visits it and others
 * filed since, not every block's season again.
 */
interface Season {
	n: number;
	sum: number;
	max: number;
	visits: ReadVisit[];
}
const seasons = new Map<number, Season>();
const SEASONS_KEPT = 1_000;

function keep(blockId: number, season: Season) {
	seasons.delete(blockId);
	seasons.set(blockId, season);
	while (seasons.size > SEASONS_KEPT) seasons.delete(seasons.keys().next().value!);
}

const byDayThenId = (a: ReadVisit, b: ReadVisit) =>
	a.visitedOn < b.visitedOn ? -1 : a.visitedOn > b.visitedOn ? 1 : a.id - b.id;

/** Every visit of each block (all days), oldest first, through the kept seasons. */
async function seasonVisits(blockIds: number[], transaction?: Transaction) {
	const prints = await select<{ blockId: number; n: number; sum: number | string; max: number }>(
		`SELECT block_id AS blockId, COUNT(*) AS n, SUM(id) AS sum, MAX(id) AS max
		 FROM visits WHERE block_id IN (?) GROUP BY block_id`,
		[blockIds],
		transaction
	);
	const printOf = new Map(
		prints.map((p) => [
			Number(p.blockId),
			{ n: Number(p.n), sum: Number(p.sum), max: Number(p.max) }
		])
	);
	const out = new Map<number, ReadVisit[]>();
	const full: number[] = [];
	const newer: { blockId: number; id: number }[] = [];
	for (const blockId of blockIds) {
		const p = printOf.get(blockId);
		const kept = seasons.get(blockId);
		if (!p) out.set(blockId, []);
		else if (kept && kept.n === p.n && kept.sum === p.sum && kept.max === p.max)
			out.set(blockId, kept.visits);
		else if (kept && kept.n < p.n && kept.max < p.max) newer.push({ blockId, id: kept.max });
		else full.push(blockId);
	}
	const [whole, added] = await Promise.all([
		full.length ? visitsWithCounts({ blockIds: full }, transaction) : [],
		newer.length ? visitsWithCounts({ after: newer }, transaction) : []
	]);
	const addedOf = groupBy(added, (v) => v.blockId);
	const again: number[] = [];
	for (const { blockId } of newer) {
		const kept = seasons.get(blockId)!;
		const more = addedOf.get(blockId) ?? [];
		const p = printOf.get(blockId)!;
		const sum = more.reduce((s, v) => s + v.id, kept.sum);
		if (kept.n + more.length !== p.n || sum !== p.sum) again.push(blockId);
		else {
			// Newer visits are nearly always of later days: appended, else sorted in.
			const visits = [...kept.visits, ...more];
			const prev = kept.visits[kept.visits.length - 1];
			if (prev && more.length && byDayThenId(prev, more[0]) > 0) visits.sort(byDayThenId);
			else if (more.length > 1) visits.sort(byDayThenId);
			keep(blockId, { ...p, visits });
			out.set(blockId, visits);
		}
	}
	const reread = again.length ? await visitsWithCounts({ blockIds: again }, transaction) : [];
	const wholeOf = groupBy([...whole, ...reread], (v) => v.blockId);
	for (const blockId of [...full, ...again]) {
		const visits = wholeOf.get(blockId) ?? [];
		const p = printOf.get(blockId)!;
		if (visits.length === p.n) keep(blockId, { ...p, visits });
		out.set(blockId, visits);
	}
	return out;
}

type EngineVisit = AssessBlockInput['visits'][number];

/** A visit as the engine takes it. */
function engineVisit(
	v: ReadVisit,
	unitCode: Map<number, string>
): AssessBlockInput['visits'][number] {
	return {
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
	};
}

/**
 * The engine form of a visit read before, made once per read (kept seasons hand the same
 * rows to batch after batch, and remaking 30 counts per visit per batch was most of the
 * garbage a batch left).
 */
const engineForms = new WeakMap<ReadVisit, { code: string; visit: EngineVisit }>();

function engineForm(v: ReadVisit, unitCode: Map<number, string>): EngineVisit {
	const code = unitCode.get(v.sampleUnitId) ?? '';
	const made = engineForms.get(v);
	if (made && made.code === code) return made.visit;
	const visit = engineVisit(v, unitCode);
	engineForms.set(v, { code, visit });
	return visit;
}

/**
 * An assessment's inputs as stored: everything the engine was given, with the visits by id.
 * Visits are never changed once filed, so the ids name exactly the counts the engine saw, and
 * an assessment row stays a few kilobytes instead of repeating the season's counts each time.
 */
export type StoredInputs = Omit<AssessBlockInput, 'visits'> & { visitIds: number[] };

export function storedInputs(input: AssessBlockInput): StoredInputs {
	const { visits, ...rest } = input;
	return { ...rest, visitIds: visits.map((v) => Number(v.id)) };
}

/** The full engine input of a stored assessment (its visits read back by id), to run again. */
export async function replayInputs(
	stored: StoredInputs | AssessBlockInput,
	transaction?: Transaction
): Promise<AssessBlockInput> {
	if (!('visitIds' in stored)) return stored;
	const { visitIds, ...rest } = stored;
	const [rows, units] = await Promise.all([
		visitIds.length ? visitsWithCounts({ ids: visitIds }, transaction) : Promise.resolve([]),
		select<{ id: number; code: string }>(`SELECT id, code FROM sample_units`, [], transaction)
	]);
	const unitCode = new Map(units.map((u) => [u.id, u.code]));
	const byId = new Map(rows.map((v) => [v.id, v]));
	const missing = visitIds.filter((id) => !byId.has(id));
	if (missing.length) throw new Error(`Visits ${missing.join(', ')} of this assessment are gone`);
	return { ...rest, visits: visitIds.map((id) => engineVisit(byId.get(id)!, unitCode)) };
}

/** One block's engine input, with the block row the alerts need. */
export interface EngineInput {
	block: Block;
	input: AssessBlockInput;
	/** Units per plant by sample unit code (the block's figure follows its latest visit). */
	unitsPerPlant: Map<string, number | null>;
}

/**
 * The input as of an earlier day, or without some visits: what the engine would have been
 * given had only the kept visits up to `asOf` been filed (the visit batch assesses each visit
 * over the visits before it).
 */
export function inputAsOf(
	e: EngineInput,
	asOf: string,
	keep: (visitId: number) => boolean
): AssessBlockInput {
	const visits = e.input.visits.filter((v) => v.date <= asOf && keep(Number(v.id)));
	const last = visits[visits.length - 1];
	const unitsPerPlant = last ? e.unitsPerPlant.get(last.sampleUnit) : null;
	return {
		...e.input,
		asOf,
		block: { ...e.input.block, unitsPerPlant: unitsPerPlant ?? undefined },
		visits
	};
}

/** Everything the engine needs for one block, in a handful of plain queries. */
export async function engineInput(
	blockId: number,
	asOf: string,
	transaction?: Transaction
): Promise<EngineInput> {
	const found = (await engineInputs([blockId], asOf, transaction)).get(blockId);
	if (!found) throw new Error(`Block ${blockId} not found`);
	return found;
}

const groupBy = <T, K>(rows: T[], key: (r: T) => K) => {
	const m = new Map<K, T[]>();
	for (const r of rows) {
		const list = m.get(key(r));
		if (list) list.push(r);
		else m.set(key(r), [r]);
	}
	return m;
};

/**
 * The engine's input for several blocks as of one day, in the same handful of queries as for
 * one (the visit batch reassesses every block it wrote to at once). Blocks that do not exist
 * are left out of the map.
 */
export async function engineInputs(
	blockIds: number[],
	asOf: string,
	transaction?: Transaction,
	opts: { keptSeasons?: boolean } = {}
) {
	const blocks = blockIds.length
		? await select<BlockRow>(
				`SELECT ${BLOCK_COLUMNS} FROM blocks WHERE id IN (?)`,
				[[...new Set(blockIds)]],
				transaction
			)
		: [];
	const out = new Map<number, EngineInput>();
	if (!blocks.length) return out;
	const ids = blocks.map((b) => b.id);
	const cropIds = [...new Set(blocks.map((b) => b.cropId))];
	const pestIds = [...new Set(blocks.map((b) => b.pestId))];
	const orgIds = [...new Set(blocks.map((b) => b.organisationId))];
	const farmIds = [...new Set(blocks.map((b) => b.farmId))];
	const [crops, pests, rules, units, visits, weather] = await Promise.all([
		select<{ id: number; code: string; params: string }>(
			`SELECT id, code, params FROM crops WHERE id IN (?)`,
			[cropIds],
			transaction
		),
		select<{ id: number; code: string; params: string }>(
			`SELECT id, code, params FROM pests WHERE id IN (?)`,
			[pestIds],
			transaction
		),
		select<RuleRow & { cropId: number; pestId: number }>(
			`SELECT ${RULE_COLUMNS}
			 FROM threshold_rules r LEFT JOIN sample_units u ON u.id = r.sample_unit_id
			 WHERE r.crop_id IN (?) AND r.pest_id IN (?) AND r.active = 1
			   AND (r.organisation_id IN (?) OR r.organisation_id IS NULL)
			 ORDER BY r.id`,
			[cropIds, pestIds, orgIds],
			transaction
		),
		select<{ id: number; code: string; unitsPerPlant: number | null }>(
			`SELECT id, code, units_per_plant_default AS unitsPerPlant FROM sample_units`,
			[],
			transaction
		),
		opts.keptSeasons
			? seasonVisits(ids, transaction).then((m) =>
					[...m.values()].flat().filter((v) => v.visitedOn <= asOf)
				)
			: visitsWithCounts({ blockIds: ids, asOf }, transaction),
		select<{ farmId: number; date: string; tminC: number; tmaxC: number }>(
			`SELECT farm_id AS farmId, day AS date, tmin_c AS tminC, tmax_c AS tmaxC FROM weather_days
			 WHERE farm_id IN (?) ORDER BY farm_id, day`,
			[farmIds],
			transaction
		)
	]);
	const cropOf = new Map(crops.map((c) => [c.id, c]));
	const pestOf = new Map(pests.map((p) => [p.id, p]));
	const rulesOf = groupBy(rules, (r) => `${r.cropId}:${r.pestId}`);
	const visitsOf = groupBy(visits, (v) => v.blockId);
	const weatherOf = groupBy(weather, (w) => w.farmId);
	const unitCode = new Map(units.map((u) => [u.id, u.code]));
	const perCode = new Map(units.map((u) => [u.code, u.unitsPerPlant]));
	for (const row of blocks) {
		const crop = cropOf.get(row.cropId)!;
		const pest = pestOf.get(row.pestId)!;
		const own = visitsOf.get(row.id) ?? [];
		const last = own[own.length - 1];
		const unitsPerPlant = last
			? units.find((u) => u.id === last.sampleUnitId)?.unitsPerPlant
			: null;
		const input: AssessBlockInput = {
			asOf,
			crop: json<AssessBlockInput['crop']>(crop.params),
			pest: json<AssessBlockInput['pest']>(pest.params),
			thresholds: applicable(
				rulesOf.get(`${row.cropId}:${row.pestId}`) ?? [],
				row.organisationId
			).map((r) => ({ ...r, cropCode: crop.code, pestCode: pest.code })),
			block: {
				areaHa: row.areaHa,
				plantsPerHa: row.plantsPerHa,
				unitsPerPlant: unitsPerPlant ?? undefined,
				expectedYieldKgHa: row.expectedYieldKgHa ?? undefined,
				pricePerKg: row.pricePerKg ?? undefined,
				rescoutDays: row.rescoutDays
			},
			visits: own.map((v) => engineForm(v, unitCode)),
			weather: (weatherOf.get(row.farmId) ?? []).map((w) => ({
				date: w.date,
				tminC: w.tminC,
				tmaxC: w.tmaxC
			}))
		};
		const block = Block.build(row as unknown as InferCreationAttributes<Block>, {
			isNewRecord: false,
			raw: true
		});
		out.set(row.id, { block, input, unitsPerPlant: perCode });
	}
	return out;
}

/** JSON columns come back parsed from the model layer, as text from a plain query. */
export function json<T>(v: string | T): T {
	return typeof v === 'string' ? (JSON.parse(v) as T) : v;
}
