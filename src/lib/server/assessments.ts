import { QueryTypes, type Transaction } from 'sequelize';
import { error } from '@sveltejs/kit';
import {
	assessBlock,
	EngineInputError,
	type AssessBlockInput,
	type Assessment as EngineAssessment
} from '../engine';
import { engineInput, storedInputs } from './assessment-input';
import { Block } from './db/models';
import { sqlTime } from './db/sql';
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

export { engineInput, replayInputs, rulesFor } from './assessment-input';

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
	const rows: {
		visitId: number | null;
		asOf: string;
		result: EngineAssessment;
		inputs: AssessBlockInput;
	}[] = [];
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
	await storeAssessments(
		rows.map((r) => ({
			blockId,
			visitId: r.visitId,
			computedAt: opts.history ? new Date(`${r.asOf}T12:00:00Z`) : now,
			result: r.result,
			inputs: r.inputs
		})),
		t
	);
	const previous = block.currentLevel;
	const last = input.visits[input.visits.length - 1];
	await setBlockLevels([{ blockId, result: latest, lastVisitOn: last?.date ?? null, at: now }], t);
	if (opts.notify !== false && previous !== latest.level) {
		await levelChanged({ block, from: previous ?? null, to: latest, transaction: t });
	}
	return latest;
}

export interface AssessmentRow {
	blockId: number;
	visitId: number | null;
	computedAt: Date;
	result: EngineAssessment;
	inputs: AssessBlockInput;
}

/**
 * An assessment's result as stored: the engine's answer without its per-visit series, which
 * replaying the stored inputs gives again (`replayInputs`); the series grows with every visit
 * of the season and would make each row repeat the ones before it.
 */
export type StoredResult = Omit<EngineAssessment, 'perVisit'>;

export function storedResult(result: EngineAssessment): StoredResult {
	const { perVisit: _series, ...rest } = result;
	return rest;
}

/** Stores assessments with their inputs (visits by id), in one statement. */
export async function storeAssessments(rows: AssessmentRow[], transaction?: Transaction) {
	if (!rows.length) return;
	// Plain statements with bound parameters: the model layer deep-clones and escapes the inputs
	// JSON character by character, which cost more than the engine run for a season of visits.
	const values = rows.map(
		(_, i) =>
			`($${7 * i + 1}, $${7 * i + 2}, $${7 * i + 3}, $${7 * i + 4}, $${7 * i + 5}, $${7 * i + 6}, $${7 * i + 7})`
	);
	await Block.sequelize!.query(
		`INSERT INTO assessments (block_id, visit_id, computed_at, level, reason, inputs, result)
		 VALUES ${values.join(', ')}`,
		{
			bind: rows.flatMap((r) => [
				r.blockId,
				r.visitId,
				sqlTime(r.computedAt),
				r.result.level,
				r.result.reason.slice(0, 300),
				JSON.stringify(storedInputs(r.inputs)),
				JSON.stringify(storedResult(r.result))
			]),
			type: QueryTypes.INSERT,
			transaction
		}
	);
}

export interface BlockLevel {
	blockId: number;
	result: EngineAssessment;
	lastVisitOn: string | null;
	at: Date;
}

/** Sets blocks' current level, reason and last visit day, in one statement. */
export async function setBlockLevels(levels: BlockLevel[], transaction?: Transaction) {
	if (!levels.length) return;
	const bind: unknown[] = [];
	const param = (v: unknown) => `$${bind.push(v)}`;
	const column = (f: (l: BlockLevel) => unknown) =>
		`CASE id ${levels.map((l) => `WHEN ${param(l.blockId)} THEN ${param(f(l))}`).join(' ')} END`;
	const level = column((l) => l.result.level);
	const reason = column((l) => l.result.reason.slice(0, 300));
	const at = column((l) => sqlTime(l.at));
	const lastVisit = column((l) => l.lastVisitOn);
	const updated = column((l) => sqlTime(l.at));
	await Block.sequelize!.query(
		`UPDATE blocks SET current_level = ${level}, current_reason = ${reason},
		   current_level_at = ${at}, last_visit_on = ${lastVisit}, updated_at = ${updated}
		 WHERE id IN (${levels.map((l) => param(l.blockId)).join(', ')})`,
		{ bind, type: QueryTypes.UPDATE, transaction }
	);
}
