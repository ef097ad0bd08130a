import { Op, QueryTypes, UniqueConstraintError, type Transaction } from 'sequelize';
import { EngineInputError, type Assessment as EngineAssessment } from '$lib/engine';
import { LEVEL_DISPLAY } from '$lib/levels';
import type { VisitCreate } from '$lib/schemas/scouting';
import { reassessBlock } from '../assessments';
import { json } from '../assessment-input';
import { Photo, SampleUnit, transaction, User, Visit, VisitCount } from '../db';
import { sqlTime } from '../db/sql';
import { blockAccess, blockFor, type Refusal } from './access';
import { outsideBoundary } from './geo';

export interface VisitOut {
	id: number;
	clientKey: string | null;
	blockId: number;
	scout: { id: number; name: string } | null;
	visitedOn: string;
	startedAt: string | null;
	position: { lat: number; lon: number; source: 'gps' | 'manual' } | null;
	outsideBoundary: boolean;
	bbch: number | null;
	airTempC: number | null;
	sampleUnit: string;
	mode: 'count' | 'presence';
	tallyThreshold: number | null;
	samplingPlan: string | null;
	planDecision: string | null;
	enemies: {
		mummies: number;
		ladybeetles: number;
		lacewings: number;
		hoverflies: number;
		otherPredators: number;
	};
	notes: string | null;
	counts: {
		stop: number;
		unit: number;
		aphids: number | null;
		alate: number | null;
		infested: boolean;
	}[];
	photos: { id: number; url: string; thumbUrl: string }[];
	createdAt: string;
}

export interface AssessmentOut {
	level: EngineAssessment['level'];
	label: string;
	reason: string;
	value: number | null;
	mean: number | null;
	ci95: [number, number] | null;
	proportionInfested: number | null;
	n: number | null;
}

export type CreateResult =
	| { ok: true; created: boolean; visit: VisitOut; assessment: AssessmentOut | null }
	| ({ ok: false; issues?: { path: string; message: string }[] } & (
			Refusal | { status: 400 | 409; message: string }
	  ));

type VisitRow = Visit & {
	counts?: VisitCount[];
	photos?: Photo[];
	scout?: User;
	sampleUnit?: SampleUnit;
};

const INCLUDE = [
	{ model: VisitCount, as: 'counts' },
	{ model: Photo, as: 'photos', attributes: ['id'] },
	{ model: User, as: 'scout', attributes: ['id', 'name'] },
	{ model: SampleUnit, as: 'sampleUnit', attributes: ['code'] }
];

export function toApi(v: VisitRow): VisitOut {
	return {
		id: v.id,
		clientKey: v.clientKey ?? null,
		blockId: v.blockId,
		scout: v.scout ? { id: v.scout.id, name: v.scout.name } : null,
		visitedOn: v.visitedOn,
		startedAt: v.startedAt ? new Date(v.startedAt).toISOString() : null,
		position:
			v.lat !== null && v.lon !== null && v.positionSource !== 'none'
				? { lat: v.lat!, lon: v.lon!, source: v.positionSource as 'gps' | 'manual' }
				: null,
		outsideBoundary: !!v.outsideBoundary,
		bbch: v.bbch ?? null,
		airTempC: v.airTempC ?? null,
		sampleUnit: v.sampleUnit?.code ?? '',
		mode: v.mode,
		tallyThreshold: v.tallyThreshold ?? null,
		samplingPlan: v.samplingPlan ?? null,
		planDecision: v.planDecision ?? null,
		enemies: {
			mummies: v.mummies,
			ladybeetles: v.ladybeetles,
			lacewings: v.lacewings,
			hoverflies: v.hoverflies,
			otherPredators: v.otherPredators
		},
		notes: v.notes ?? null,
		counts: (v.counts ?? [])
			.slice()
			.sort((a, b) => a.stopNo - b.stopNo || a.unitNo - b.unitNo)
			.map((c) => ({
				stop: c.stopNo,
				unit: c.unitNo,
				aphids: c.aphids ?? null,
				alate: c.alate ?? null,
				infested: !!c.infested
			})),
		photos: (v.photos ?? []).map((p) => ({
			id: p.id,
			url: `/api/photos/${p.id}`,
			thumbUrl: `/api/photos/${p.id}?size=thumb`
		})),
		createdAt: new Date(v.createdAt).toISOString()
	};
}

export function assessmentOut(a: EngineAssessment): AssessmentOut {
	return {
		level: a.level,
		label: LEVEL_DISPLAY[a.level].label,
		reason: a.reason,
		value: a.value,
		mean: a.latest?.mean ?? null,
		ci95: a.latest?.ci95 ?? null,
		proportionInfested: a.latest?.proportionInfested ?? null,
		n: a.latest?.n ?? null
	};
}

async function loadVisit(id: number, transaction?: Transaction) {
	return (await Visit.findByPk(id, { include: INCLUDE, transaction })) as VisitRow | null;
}

const today = () => new Date().toISOString().slice(0, 10);

/** A visit filed before under the same client key: the same one again, or a clash. */
async function replay(user: SessionUser, input: VisitCreate): Promise<CreateResult | null> {
	if (!input.clientKey) return null;
	const existing = await Visit.findOne({
		where: { clientKey: input.clientKey },
		attributes: ['id', 'scoutId', 'blockId']
	});
	if (!existing) return null;
	return replayed(user, input, {
		earlierId: existing.id,
		earlierScout: existing.scoutId,
		earlierBlock: existing.blockId
	});
}

export async function replayed(
	user: SessionUser,
	input: VisitCreate,
	earlier: Pick<FilingRow, 'earlierId' | 'earlierScout' | 'earlierBlock'>
): Promise<CreateResult> {
	if (earlier.earlierScout !== user.id || earlier.earlierBlock !== input.blockId)
		return {
			ok: false,
			status: 409,
			message: 'This clientKey was already used for another visit; make a new key per visit.'
		};
	const v = await loadVisit(earlier.earlierId!);
	return { ok: true, created: false, visit: toApi(v!), assessment: null };
}

export interface FilingRow {
	earlierId: number | null;
	earlierScout: number | null;
	earlierBlock: number | null;
	blockId: number | null;
	organisationId: number | null;
	pestId: number;
	boundary: unknown;
	growerId: number | null;
	assigned: number;
	unitId: number | null;
}

/**
 * In one query: a visit filed before under the same client key, the block with what decides
 * access to it, and the sample unit (the checks createVisit makes before it writes).
 */
async function filingFacts(user: SessionUser, input: VisitCreate) {
	const [row] = await Visit.sequelize!.query<FilingRow>(
		`SELECT e.id AS earlierId, e.scout_id AS earlierScout, e.block_id AS earlierBlock,
		   b.id AS blockId, b.organisation_id AS organisationId, b.pest_id AS pestId, b.boundary,
		   f.grower_id AS growerId,
		   EXISTS (SELECT 1 FROM scouting_assignments a
		            WHERE a.block_id = b.id AND a.scout_id = $1 AND a.active = 1) AS assigned,
		   (SELECT id FROM sample_units WHERE code = $2) AS unitId
		 FROM (SELECT 1) one
		 LEFT JOIN visits e ON e.client_key = $3
		 LEFT JOIN blocks b ON b.id = $4
		 LEFT JOIN farms f ON f.id = b.farm_id`,
		{
			bind: [user.id, input.sampleUnit, input.clientKey ?? null, input.blockId],
			type: QueryTypes.SELECT
		}
	);
	return row;
}

/** The visits columns createVisit writes, each with the attribute that holds its value. */
const VISIT_COLUMNS = {
	block_id: 'blockId',
	scout_id: 'scoutId',
	pest_id: 'pestId',
	sample_unit_id: 'sampleUnitId',
	client_key: 'clientKey',
	visited_on: 'visitedOn',
	started_at: 'startedAt',
	lat: 'lat',
	lon: 'lon',
	position_source: 'positionSource',
	outside_boundary: 'outsideBoundary',
	bbch: 'bbch',
	air_temp_c: 'airTempC',
	mode: 'mode',
	tally_threshold: 'tallyThreshold',
	sampling_plan: 'samplingPlan',
	plan_decision: 'planDecision',
	mummies: 'mummies',
	ladybeetles: 'ladybeetles',
	lacewings: 'lacewings',
	hoverflies: 'hoverflies',
	other_predators: 'otherPredators',
	notes: 'notes',
	entry_channel: 'entryChannel',
	created_at: 'createdAt',
	updated_at: 'updatedAt'
} as const;
const INSERT_VISIT = `INSERT INTO visits (${Object.keys(VISIT_COLUMNS).join(', ')})`;

/** A visit checked against its block and turned into the rows to write. */
export interface PreparedVisit {
	blockId: number;
	row: Omit<InferVisit, 'id' | 'createdAt' | 'updatedAt'>;
	counts: {
		stopNo: number;
		unitNo: number;
		aphids: number | null;
		alate: number | null;
		infested: boolean;
	}[];
	/** The day the block is assessed as of: today, or the visit's day when a phone is ahead. */
	asOf: Date;
}

type InferVisit = { [K in (typeof VISIT_COLUMNS)[keyof typeof VISIT_COLUMNS]]: unknown } & {
	id: number;
};

type Refused = Extract<CreateResult, { ok: false }>;

/** The checks createVisit makes before it writes (access, sample unit, day), and the rows. */
export async function prepareVisit(
	user: SessionUser,
	input: VisitCreate,
	facts: FilingRow,
	channel: 'phone' | 'api' | 'csv'
): Promise<Refused | { ok: true; prepared: PreparedVisit }> {
	const access = await blockAccess(
		user,
		facts.blockId === null
			? null
			: {
					organisationId: facts.organisationId!,
					growerId: facts.growerId,
					assigned: () => !!facts.assigned
				},
		'write'
	);
	if (!access.ok) return access;
	const blockId = facts.blockId!;
	if (facts.unitId === null) {
		const message = `unknown sample unit "${input.sampleUnit}"`;
		return { ok: false, status: 400, message, issues: [{ path: 'sampleUnit', message }] };
	}
	if (input.visitedOn > today()) {
		// Visits are stored by the server's day; a phone ahead of UTC may be a day early.
		const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
		if (input.visitedOn > tomorrow) {
			const message = 'visitedOn is in the future';
			return { ok: false, status: 400, message, issues: [{ path: 'visitedOn', message }] };
		}
	}
	const pos = input.position ?? null;
	const tally = input.tallyThreshold ?? 1;
	const counts = input.counts.map((c) => ({
		stopNo: c.stop,
		unitNo: c.unit,
		aphids: c.aphids ?? null,
		alate: c.alate ?? null,
		infested: c.infested ?? (c.aphids ?? 0) >= tally
	}));
	const e = input.enemies;
	const row = {
		blockId,
		scoutId: user.id,
		pestId: facts.pestId,
		sampleUnitId: facts.unitId,
		clientKey: input.clientKey ?? null,
		visitedOn: input.visitedOn,
		startedAt: input.startedAt ? new Date(input.startedAt) : null,
		lat: pos?.lat ?? null,
		lon: pos?.lon ?? null,
		positionSource: pos?.source ?? 'none',
		outsideBoundary: pos
			? outsideBoundary(
					json(facts.boundary) as Parameters<typeof outsideBoundary>[0],
					pos.lat,
					pos.lon
				)
			: false,
		bbch: input.bbch ?? null,
		airTempC: input.airTempC ?? null,
		mode: input.mode,
		tallyThreshold: input.tallyThreshold ?? null,
		samplingPlan: input.samplingPlan ?? null,
		planDecision: input.planDecision ?? null,
		mummies: e?.mummies ?? 0,
		ladybeetles: e?.ladybeetles ?? 0,
		lacewings: e?.lacewings ?? 0,
		hoverflies: e?.hoverflies ?? 0,
		otherPredators: e?.otherPredators ?? 0,
		notes: input.notes?.trim() || null,
		entryChannel: channel
	};
	const asOf = input.visitedOn > today() ? new Date(`${input.visitedOn}T12:00:00Z`) : new Date();
	return { ok: true, prepared: { blockId, row, counts, asOf } };
}

/**
 * Writes prepared visits with their counts and links their photos, inside the caller's
 * transaction: the blocks' rows are locked first (in id order, so writers queue instead of
 * deadlocking on the foreign-key check and the level update), then one INSERT for all the
 * visits and one for all their counts. Answers the new ids in order and the stored time.
 */
export async function writeVisits(
	visits: { user: SessionUser; input: VisitCreate; prepared: PreparedVisit }[],
	transaction: Transaction
): Promise<{ ids: number[]; now: Date }> {
	const sequelize = Visit.sequelize!;
	const blockIds = [...new Set(visits.map((v) => v.prepared.blockId))].sort((a, b) => a - b);
	await sequelize.query(`SELECT id FROM blocks WHERE id IN (?) ORDER BY id FOR UPDATE`, {
		replacements: [blockIds],
		type: QueryTypes.SELECT,
		transaction
	});
	// DATETIME columns keep whole seconds; the answer shows what a re-read would.
	const now = new Date(Math.floor(Date.now() / 1000) * 1000);
	const bind: unknown[] = [];
	const param = (v: unknown) => `$${bind.push(v instanceof Date ? sqlTime(v) : v)}`;
	const tuples = visits.map(({ prepared }) => {
		const written = { ...prepared.row, createdAt: now, updatedAt: now } as Record<string, unknown>;
		return `(${Object.values(VISIT_COLUMNS)
			.map((k) => param(written[k]))
			.join(', ')})`;
	});
	// RETURNING gives the new ids in the order of the rows (MariaDB 10.5 and later).
	const inserted = await sequelize.query<{ id: number }>(
		`${INSERT_VISIT} VALUES ${tuples.join(', ')} RETURNING id`,
		{ bind, type: QueryTypes.SELECT, transaction }
	);
	const ids = inserted.map((r) => Number(r.id));
	// One multi-row INSERT of plain rows: model instances for 30 counts cost more than the write.
	const countBind: unknown[] = [];
	const countRows: string[] = [];
	visits.forEach(({ prepared }, k) => {
		for (const c of prepared.counts) {
			const n = countBind.push(ids[k], c.stopNo, c.unitNo, c.aphids, c.alate, c.infested);
			countRows.push(`($${n - 5}, $${n - 4}, $${n - 3}, $${n - 2}, $${n - 1}, $${n})`);
		}
	});
	if (countRows.length) {
		await sequelize.query(
			`INSERT INTO visit_counts (visit_id, stop_no, unit_no, aphids, alate, infested) VALUES ${countRows.join(', ')}`,
			{ bind: countBind, type: QueryTypes.INSERT, transaction }
		);
	}
	for (const [k, { user, input, prepared }] of visits.entries()) {
		if (!input.photoIds.length) continue;
		const [linked] = await Photo.update(
			{ visitId: ids[k] },
			{
				where: {
					id: { [Op.in]: input.photoIds },
					uploadedBy: user.id,
					blockId: prepared.blockId,
					visitId: null
				},
				transaction
			}
		);
		if (linked !== new Set(input.photoIds).size)
			throw new BadInput(
				'photoIds',
				'a photo is unknown, not yours, of another block or already used'
			);
	}
	return { ids, now };
}

/**
 * The answer for a stored visit, built from what was written as GET /api/visits/:id shows it
 * (compared in tests/http/visits.spec.ts), saving a query with four joins per visit.
 */
export function filed(
	user: SessionUser,
	input: VisitCreate,
	prepared: PreparedVisit,
	id: number,
	now: Date,
	assessment: EngineAssessment
): CreateResult {
	const row = prepared.row;
	const started = row.startedAt as Date | null;
	const stored = {
		...row,
		id,
		startedAt: started && new Date(Math.floor(started.getTime() / 1000) * 1000),
		createdAt: now,
		updatedAt: now,
		counts: prepared.counts,
		photos: [...new Set(input.photoIds)].sort((a, b) => a - b).map((id) => ({ id })),
		scout: { id: user.id, name: user.name },
		sampleUnit: { code: input.sampleUnit }
	} as unknown as VisitRow;
	return { ok: true, created: true, visit: toApi(stored), assessment: assessmentOut(assessment) };
}

/** A refusal for input the write or the engine turned down (it names the field). */
export function refusedInput(e: unknown): Refused | null {
	if (e instanceof BadInput || e instanceof EngineInputError) {
		const path = e instanceof BadInput ? e.path : e.field;
		const message = e instanceof BadInput ? `${path}: ${e.message}` : e.message;
		return { ok: false, status: 400, message, issues: [{ path, message }] };
	}
	return null;
}

/**
 * Files one visit: checks the block, stores the visit and its counts, links its photos and
 * reassesses the block, all in one transaction. A repeated clientKey returns the stored visit.
 */
export async function createVisit(
	user: SessionUser,
	input: VisitCreate,
	channel: 'phone' | 'api' | 'csv'
): Promise<CreateResult> {
	const facts = await filingFacts(user, input);
	if (facts.earlierId !== null) return replayed(user, input, facts);
	const checked = await prepareVisit(user, input, facts, channel);
	if (!checked.ok) return checked;
	const { prepared } = checked;
	try {
		const out = await transaction(async (transaction) => {
			const {
				ids: [visitId],
				now
			} = await writeVisits([{ user, input, prepared }], transaction);
			const assessment = await reassessBlock(prepared.blockId, {
				transaction,
				visitId,
				today: prepared.asOf
			});
			return { visitId, now, assessment };
		});
		return filed(user, input, prepared, out.visitId, out.now, out.assessment);
	} catch (e) {
		if (e instanceof UniqueConstraintError && input.clientKey) {
			const again2 = await replay(user, input);
			if (again2) return again2;
		}
		const refused = refusedInput(e);
		if (refused) return refused;
		throw e;
	}
}

class BadInput extends Error {
	constructor(
		public path: string,
		message: string
	) {
		super(message);
	}
}

/** One visit, if the user may see its block. */
export async function visitFor(user: SessionUser, id: number) {
	const v = await loadVisit(id);
	if (!v) return { ok: false as const, status: 404 as const, message: 'No such visit.' };
	const access = await blockFor(user, v.blockId, 'read');
	if (!access.ok) return access.status === 403 ? access : { ...access, message: 'No such visit.' };
	return { ok: true as const, value: toApi(v) };
}

/** A block's visits, newest first (with counts). */
export async function visitsOfBlock(
	blockId: number,
	opts: { limit?: number; since?: string } = {}
) {
	const rows = (await Visit.findAll({
		where: { blockId, ...(opts.since ? { visitedOn: { [Op.gte]: opts.since } } : {}) },
		include: INCLUDE,
		order: [
			['visitedOn', 'DESC'],
			['id', 'DESC']
		],
		limit: opts.limit
	})) as VisitRow[];
	return rows.map(toApi);
}
