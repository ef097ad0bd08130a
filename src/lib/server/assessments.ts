import { QueryTypes, type Transaction } from 'sequelize';
import { error } from '@sveltejs/kit';
import { assessBlock, EngineInputError, type Assessment as EngineAssessment } from '../engine';
import { engineInput } from './assessment-input';
import { Block } from './db/models';
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

export { engineInput, rulesFor } from './assessment-input';

const iso = (d: Date) => d.toISOString().slice(0, 10);

/** A UTC DATETIME literal with milliseconds (the app's connection runs at +00:00). */
export const sqlTime = (d: Date) => d.toISOString().slice(0, 23).replace('T', ' ');

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
	const sequelize = Block.sequelize!;
	// Plain statements with bound parameters: the model layer deep-clones and escapes the inputs
	// JSON character by character, which cost more than the engine run for a season of visits.
	const values = rows.map(
		(r, i) =>
			`($${7 * i + 1}, $${7 * i + 2}, $${7 * i + 3}, $${7 * i + 4}, $${7 * i + 5}, $${7 * i + 6}, $${7 * i + 7})`
	);
	await sequelize.query(
		`INSERT INTO assessments (block_id, visit_id, computed_at, level, reason, inputs, result)
		 VALUES ${values.join(', ')}`,
		{
			bind: rows.flatMap((r) => [
				blockId,
				r.visitId,
				sqlTime(opts.history ? new Date(`${r.asOf}T12:00:00Z`) : now),
				r.result.level,
				r.result.reason.slice(0, 300),
				JSON.stringify(r.inputs),
				JSON.stringify(r.result)
			]),
			type: QueryTypes.INSERT,
			transaction: t
		}
	);
	const previous = block.currentLevel;
	const last = input.visits[input.visits.length - 1];
	await sequelize.query(
		`UPDATE blocks SET current_level = $1, current_reason = $2, current_level_at = $3,
		   last_visit_on = $4, updated_at = $3 WHERE id = $5`,
		{
			bind: [latest.level, latest.reason.slice(0, 300), sqlTime(now), last?.date ?? null, blockId],
			type: QueryTypes.UPDATE,
			transaction: t
		}
	);
	if (opts.notify !== false && previous !== latest.level) {
		await levelChanged({ block, from: previous ?? null, to: latest, transaction: t });
	}
	return latest;
}
