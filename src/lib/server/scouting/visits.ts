import { Op, UniqueConstraintError, type Transaction } from 'sequelize';
import { EngineInputError, type Assessment as EngineAssessment } from '$lib/engine';
import { LEVEL_DISPLAY } from '$lib/levels';
import type { VisitCreate } from '$lib/schemas/scouting';
import { reassessBlock } from '../assessments';
import { Block, Photo, SampleUnit, transaction, User, Visit, VisitCount } from '../db';
import { blockFor, type Refusal } from './access';
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
	if (existing.scoutId !== user.id || existing.blockId !== input.blockId)
		return {
			ok: false,
			status: 409,
			message: 'This clientKey was already used for another visit; make a new key per visit.'
		};
	const v = await loadVisit(existing.id);
	return { ok: true, created: false, visit: toApi(v!), assessment: null };
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
	const again = await replay(user, input);
	if (again) return again;
	const access = await blockFor(user, input.blockId, 'write');
	if (!access.ok) return access;
	const block = access.value;
	const unit = await SampleUnit.findOne({ where: { code: input.sampleUnit } });
	if (!unit) {
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
	try {
		const out = await transaction(async (transaction) => {
			// Writers to one block take its row lock first, so concurrent visits queue instead of
			// deadlocking on the foreign-key check and the block's level update.
			await Block.findByPk(block.id, {
				transaction,
				lock: transaction.LOCK.UPDATE,
				attributes: ['id']
			});
			const visit = await Visit.create(
				{
					blockId: block.id,
					scoutId: user.id,
					pestId: block.pestId,
					sampleUnitId: unit.id,
					clientKey: input.clientKey ?? null,
					visitedOn: input.visitedOn,
					startedAt: input.startedAt ? new Date(input.startedAt) : null,
					lat: pos?.lat ?? null,
					lon: pos?.lon ?? null,
					positionSource: pos?.source ?? 'none',
					outsideBoundary: pos ? outsideBoundary(block.boundary ?? null, pos.lat, pos.lon) : false,
					bbch: input.bbch ?? null,
					airTempC: input.airTempC ?? null,
					mode: input.mode,
					tallyThreshold: input.tallyThreshold ?? null,
					samplingPlan: input.samplingPlan ?? null,
					planDecision: input.planDecision ?? null,
					...input.enemies,
					notes: input.notes?.trim() || null,
					entryChannel: channel
				},
				{ transaction }
			);
			const tally = input.tallyThreshold ?? 1;
			await VisitCount.bulkCreate(
				input.counts.map((c) => ({
					visitId: visit.id,
					stopNo: c.stop,
					unitNo: c.unit,
					aphids: c.aphids ?? null,
					alate: c.alate ?? null,
					infested: c.infested ?? (c.aphids ?? 0) >= tally
				})),
				{ transaction }
			);
			if (input.photoIds.length) {
				const [linked] = await Photo.update(
					{ visitId: visit.id },
					{
						where: {
							id: { [Op.in]: input.photoIds },
							uploadedBy: user.id,
							blockId: block.id,
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
			const asOf =
				input.visitedOn > today() ? new Date(`${input.visitedOn}T12:00:00Z`) : new Date();
			const assessment = await reassessBlock(block.id, {
				transaction,
				visitId: visit.id,
				today: asOf
			});
			return { id: visit.id, assessment };
		});
		const v = await loadVisit(out.id);
		return { ok: true, created: true, visit: toApi(v!), assessment: assessmentOut(out.assessment) };
	} catch (e) {
		if (e instanceof UniqueConstraintError && input.clientKey) {
			const again2 = await replay(user, input);
			if (again2) return again2;
		}
		if (e instanceof BadInput || e instanceof EngineInputError) {
			const path = e instanceof BadInput ? e.path : e.field;
			const message = e instanceof BadInput ? `${path}: ${e.message}` : e.message;
			return { ok: false, status: 400, message, issues: [{ path, message }] };
		}
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
