import { Op, type Transaction } from 'sequelize';
import { error } from '@sveltejs/kit';
import {
	assessBlock,
	EngineInputError,
	type AssessBlockInput,
	type Assessment as EngineAssessment
} from '../engine';
import type { ThresholdRule as EngineRule } from '../engine';
import {
	Assessment,
	Block,
	Crop,
	Pest,
	SampleUnit,
	ThresholdRule,
	Visit,
	VisitCount,
	WeatherDay
} from './db/models';
import { levelChanged } from './events';

/**
 * reassessBlock for writes made by a person: input the engine refuses (it names the field)
 * becomes a 400 that rolls the caller's transaction back, instead of a server error.
 */
export async function reassessOrRefuse(blockId: number, opts: ReassessOptions = {}) {
	try {
		return await reassessBlock(blockId, opts);
	} catch (e) {
		if (e instanceof EngineInputError) {
			error(
				400,
				`Block ${blockId} could not be assessed with this change: ${e.field}: ${e.message}`
			);
		}
		throw e;
	}
}

export interface ReassessOptions {
	today?: Date;
	/** Store one assessment per visit (as of that visit), not only the latest. */
	history?: boolean;
	/** Hand a level change to the alerts entry point (off while seeding). */
	notify?: boolean;
	transaction?: Transaction;
	/** The visit that triggered this assessment, if any. */
	visitId?: number;
}

/** Threshold rules for a crop and pest: the organisation's own where it has any, else the library's. */
export async function rulesFor(
	organisationId: number,
	cropId: number,
	pestId: number,
	transaction?: Transaction
) {
	const rows = await ThresholdRule.findAll({
		where: {
			cropId,
			pestId,
			active: true,
			organisationId: { [Op.or]: [organisationId, null] }
		},
		include: [{ model: SampleUnit, as: 'sampleUnit', attributes: ['code'] }],
		transaction
	});
	const own = rows.filter((r) => r.organisationId === organisationId);
	return (own.length ? own : rows).map(toEngineRule);
}

function toEngineRule(
	r: ThresholdRule & { sampleUnit?: SampleUnit }
): Omit<EngineRule, 'cropCode' | 'pestCode'> {
	return {
		bbchFrom: r.bbchFrom,
		bbchTo: r.bbchTo,
		sampleUnit: r.sampleUnit?.code ?? '',
		metric: r.metric,
		tallyThreshold: r.tallyThreshold ?? undefined,
		action: r.action,
		injury: r.injury ?? undefined,
		requiresRising: r.requiresRising,
		alsoProportion: r.alsoProportion ?? undefined,
		label: r.label,
		source: r.source,
		provenance: r.provenance
	};
}

/** Everything the engine needs for one block, read in a handful of queries. */
export async function engineInput(blockId: number, asOf: string, transaction?: Transaction) {
	const block = await Block.findByPk(blockId, {
		include: [
			{ model: Crop, as: 'crop' },
			{ model: Pest, as: 'pest' }
		],
		transaction
	});
	if (!block) throw new Error(`Block ${blockId} not found`);
	const crop = (block as Block & { crop: Crop }).crop;
	const pest = (block as Block & { pest: Pest }).pest;
	const [rules, units, visits, weather] = await Promise.all([
		rulesFor(block.organisationId, block.cropId, block.pestId, transaction),
		SampleUnit.findAll({ transaction }),
		Visit.findAll({
			where: { blockId, visitedOn: { [Op.lte]: asOf } },
			include: [{ model: VisitCount, as: 'counts' }],
			order: [
				['visitedOn', 'ASC'],
				['id', 'ASC']
			],
			transaction
		}),
		WeatherDay.findAll({ where: { farmId: block.farmId }, order: [['day', 'ASC']], transaction })
	]);
	const unitCode = new Map(units.map((u) => [u.id, u.code]));
	const unitsPerPlant = visits.length
		? units.find((u) => u.id === visits[visits.length - 1].sampleUnitId)?.unitsPerPlantDefault
		: undefined;
	const input: AssessBlockInput = {
		asOf,
		crop: crop.params,
		pest: pest.params,
		thresholds: rules.map((r) => ({ ...r, cropCode: crop.code, pestCode: pest.code })),
		block: {
			areaHa: block.areaHa,
			plantsPerHa: block.plantsPerHa,
			unitsPerPlant: unitsPerPlant ?? undefined,
			expectedYieldKgHa: block.expectedYieldKgHa ?? undefined,
			pricePerKg: block.pricePerKg ?? undefined,
			rescoutDays: block.rescoutDays
		},
		visits: visits.map((v) => ({
			id: v.id,
			date: v.visitedOn,
			bbch: v.bbch ?? undefined,
			sampleUnit: unitCode.get(v.sampleUnitId) ?? '',
			units: ((v as Visit & { counts: VisitCount[] }).counts ?? [])
				.sort((a, b) => a.stopNo - b.stopNo || a.unitNo - b.unitNo)
				.map((c) =>
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
		weather: weather.map((w) => ({ date: w.day, tminC: w.tminC, tmaxC: w.tmaxC }))
	};
	return { block, input, visitIds: visits.map((v) => v.id) };
}

const iso = (d: Date) => d.toISOString().slice(0, 10);

/**
 * Runs the engine for a block, stores the assessment with its inputs, updates the block's
 * current level and hands a change of level to the alerts entry point.
 */
export async function reassessBlock(
	blockId: number,
	opts: ReassessOptions = {}
): Promise<EngineAssessment> {
	const today = iso(opts.today ?? new Date());
	const t = opts.transaction;
	const { block, input } = await engineInput(blockId, today, t);
	const rows: { visitId: number | null; asOf: string; result: EngineAssessment; inputs: object }[] =
		[];
	if (opts.history) {
		for (let i = 0; i < input.visits.length; i++) {
			const sub = { ...input, asOf: input.visits[i].date, visits: input.visits.slice(0, i + 1) };
			rows.push({
				visitId: Number(input.visits[i].id),
				asOf: sub.asOf,
				result: assessBlock(sub),
				inputs: sub
			});
		}
	}
	const latest = assessBlock(input);
	if (!opts.history || !input.visits.length) {
		rows.push({ visitId: opts.visitId ?? null, asOf: today, result: latest, inputs: input });
	}
	const now = new Date();
	await Assessment.bulkCreate(
		rows.map((r) => ({
			blockId,
			visitId: r.visitId,
			computedAt: opts.history ? new Date(`${r.asOf}T12:00:00Z`) : now,
			level: r.result.level,
			reason: r.result.reason.slice(0, 300),
			inputs: r.inputs,
			result: r.result
		})),
		{ transaction: t }
	);
	const previous = block.currentLevel;
	const last = input.visits[input.visits.length - 1];
	await block.update(
		{
			currentLevel: latest.level,
			currentReason: latest.reason.slice(0, 300),
			currentLevelAt: now,
			lastVisitOn: last?.date ?? null
		},
		{ transaction: t }
	);
	if (opts.notify !== false && previous !== latest.level) {
		await levelChanged({ block, from: previous ?? null, to: latest, transaction: t });
	}
	return latest;
}
