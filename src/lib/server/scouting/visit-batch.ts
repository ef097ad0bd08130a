import { QueryTypes, type Transaction } from 'sequelize';
import { assessBlock, type Assessment as EngineAssessment, type LevelKey } from '$lib/engine';
import type { VisitCreate } from '$lib/schemas/scouting';
import { engineInputs, inputAsOf } from '../assessment-input';
import { setBlockLevels, storeAssessments, type AssessmentRow } from '../assessments';
import { isDatabaseUnavailable } from '../db/availability';
import { transaction, Visit } from '../db';
import { levelsChanged } from '../events';
import {
	createVisit,
	filed,
	prepareVisit,
	replayed,
	writeVisits,
	type CreateResult,
	type FilingRow,
	type PreparedVisit
} from './visits';

/**
 * Visits filed through the API are written in batches: the visits that arrive while a batch
 * is being written wait and go together in the next one, in one transaction, with the same
 * handful of statements a single visit needs (facts, lock, visits, counts, engine input,
 * assessments, levels). Each caller is answered only once its batch has committed, with the
 * same answer `createVisit` gives, and each visit is assessed over exactly the visits filed
 * before it, as if they had come one at a time in the order they arrived.
 *
 * A batch that fails for any reason other than the database being away is filed again one
 * visit at a time through `createVisit`, so one visit's bad photo or a clientKey clash with
 * another instance's batch refuses that visit alone.
 */

interface Waiting {
	user: SessionUser;
	input: VisitCreate;
	channel: 'phone' | 'api';
	resolve: (r: CreateResult) => void;
	reject: (e: unknown) => void;
}

/** At most this many visits, or this many counts, in one batch (keeps statements small). */
const MAX_VISITS = 100;
const MAX_COUNTS = 6_000;
/**
 * Batches written at once by one process. A second starts only when enough visits wait, so
 * that it overlaps the first's round trips instead of splitting the arrivals into small
 * batches that each pay for the same statements.
 */
const IN_FLIGHT = Number(process.env.VISIT_BATCHES ?? 2);
const SECOND_AT = 8;

const mayStart = () =>
	queue.length > 0 && (running === 0 || (running < IN_FLIGHT && queue.length >= SECOND_AT));

const queue: Waiting[] = [];
let running = 0;

/** Files one visit through the next batch; resolves once it is stored (or refused). */
export function fileVisit(
	user: SessionUser,
	input: VisitCreate,
	channel: 'phone' | 'api'
): Promise<CreateResult> {
	return new Promise((resolve, reject) => {
		queue.push({ user, input, channel, resolve, reject });
		if (mayStart()) {
			running++;
			setImmediate(drain);
		}
	});
}

async function drain() {
	try {
		do await fileBatch(take());
		while (queue.length && (running === 1 || queue.length >= SECOND_AT));
	} finally {
		running--;
	}
	// Visits that came while this batch was written and were left for a second writer.
	if (mayStart()) {
		running++;
		setImmediate(drain);
	}
}

function take(): Waiting[] {
	const batch: Waiting[] = [];
	let counts = 0;
	while (queue.length && batch.length < MAX_VISITS) {
		const next = queue[0];
		if (batch.length && counts + next.input.counts.length > MAX_COUNTS) break;
		counts += next.input.counts.length;
		batch.push(queue.shift()!);
	}
	return batch;
}

/** The facts `createVisit` reads for one visit, for every visit of a batch in one query. */
async function filingFacts(batch: Waiting[]): Promise<FilingRow[]> {
	const bind: unknown[] = [];
	const param = (v: unknown) => `$${bind.push(v)}`;
	const keys = batch
		.map(
			(w, i) =>
				`SELECT ${param(i)} AS i, ${param(w.user.id)} AS scout, ${param(w.input.sampleUnit)} AS unit,
				   ${param(w.input.clientKey ?? null)} AS ckey, ${param(w.input.blockId)} AS block,
				   ${param(w.input.position ? 1 : 0)} AS placed`
		)
		.join(' UNION ALL ');
	const rows = await Visit.sequelize!.query<FilingRow & { i: number }>(
		`SELECT k.i, e.id AS earlierId, e.scout_id AS earlierScout, e.block_id AS earlierBlock,
		   b.id AS blockId, b.organisation_id AS organisationId, b.pest_id AS pestId,
		   IF(k.placed = 1, b.boundary, NULL) AS boundary,
		   f.grower_id AS growerId,
		   EXISTS (SELECT 1 FROM scouting_assignments a
		            WHERE a.block_id = b.id AND a.scout_id = k.scout AND a.active = 1) AS assigned,
		   (SELECT id FROM sample_units WHERE code = k.unit) AS unitId
		 FROM (${keys}) k
		 LEFT JOIN visits e ON e.client_key = k.ckey
		 LEFT JOIN blocks b ON b.id = k.block
		 LEFT JOIN farms f ON f.id = b.farm_id`,
		{ bind, type: QueryTypes.SELECT }
	);
	const out: FilingRow[] = [];
	for (const r of rows) out[Number(r.i)] = r;
	return out;
}

interface Accepted {
	w: Waiting;
	prepared: PreparedVisit;
}

async function fileBatch(batch: Waiting[]) {
	const accepted: Accepted[] = [];
	// Filed one at a time after the batch, each in its own transaction.
	const alone: Waiting[] = [];
	let facts: FilingRow[];
	try {
		facts = await filingFacts(batch);
	} catch (e) {
		if (isDatabaseUnavailable(e)) return batch.forEach((w) => w.reject(e));
		facts = [];
		alone.push(...batch);
	}
	const keys = new Set<string>();
	for (const [i, f] of facts.entries()) {
		const w = batch[i];
		const key = w.input.clientKey;
		// A resend of a visit in this same batch is answered after it, as a replay.
		if (key && keys.has(key)) {
			alone.push(w);
			continue;
		}
		if (key) keys.add(key);
		if (f.earlierId !== null) {
			replayed(w.user, w.input, f).then(w.resolve, w.reject);
			continue;
		}
		try {
			const checked = await prepareVisit(w.user, w.input, f, w.channel);
			if (checked.ok) accepted.push({ w, prepared: checked.prepared });
			else w.resolve(checked);
		} catch (e) {
			w.reject(e);
		}
	}
	if (accepted.length) {
		try {
			const answers = await transaction((t) => writeAndAssess(accepted, t));
			accepted.forEach((a, k) => a.w.resolve(answers[k]));
		} catch (e) {
			if (isDatabaseUnavailable(e)) {
				return [...accepted.map((a) => a.w), ...alone].forEach((w) => w.reject(e));
			}
			// The visit at fault (a photo not its own, a clientKey another instance just
			// stored, input the engine refuses) is then refused alone.
			alone.unshift(...accepted.map((a) => a.w));
		}
	}
	for (const w of alone) await createVisit(w.user, w.input, w.channel).then(w.resolve, w.reject);
}

async function writeAndAssess(accepted: Accepted[], t: Transaction): Promise<CreateResult[]> {
	const { ids, now } = await writeVisits(
		accepted.map((a) => ({ user: a.w.user, input: a.w.input, prepared: a.prepared })),
		t
	);
	const day = (d: Date) => d.toISOString().slice(0, 10);
	const lastDay = accepted.map((a) => day(a.prepared.asOf)).sort()[accepted.length - 1];
	const inputs = await engineInputs(
		accepted.map((a) => a.prepared.blockId),
		lastDay,
		t,
		{ keptSeasons: true }
	);
	const computedAt = new Date();
	const rows: AssessmentRow[] = [];
	const results: EngineAssessment[] = [];
	const levels = new Map<number, { result: EngineAssessment; lastVisitOn: string | null }>();
	const changes: Parameters<typeof levelsChanged>[0] = [];
	const previous = new Map<number, LevelKey | null>();
	for (const [k, a] of accepted.entries()) {
		const blockId = a.prepared.blockId;
		const e = inputs.get(blockId)!;
		// Visits of this batch filed after this one are not part of its assessment.
		const after = new Set<number>();
		for (let j = k + 1; j < accepted.length; j++)
			if (accepted[j].prepared.blockId === blockId) after.add(ids[j]);
		const input = inputAsOf(e, day(a.prepared.asOf), (id) => !after.has(id));
		const result = assessBlock(input);
		results.push(result);
		rows.push({ blockId, visitId: ids[k], computedAt, result, inputs: input });
		const last = input.visits[input.visits.length - 1];
		levels.set(blockId, { result, lastVisitOn: last?.date ?? null });
		const from = previous.has(blockId) ? previous.get(blockId)! : (e.block.currentLevel ?? null);
		if (from !== result.level) changes.push({ block: e.block, from, to: result });
		previous.set(blockId, result.level);
	}
	await storeAssessments(rows, t);
	await setBlockLevels(
		[...levels].map(([blockId, l]) => ({ blockId, ...l, at: computedAt })),
		t
	);
	await levelsChanged(changes, t);
	return accepted.map((a, k) => filed(a.w.user, a.w.input, a.prepared, ids[k], now, results[k]));
}
