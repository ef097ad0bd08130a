import { error } from '@sveltejs/kit';
import type { Transaction } from 'sequelize';
import { isoPlusDays } from '$lib/engine';
import type { Decision, RecommendationWarning } from '$lib/domain';
import { db } from '../db';
import { Assessment, Product, Recommendation } from '../db/models';
import { recommendationIssued } from '../events';
import { audit } from './audit';
import { checkContext, treatmentWarnings } from './checks';
import { blockFor, recommendationFor, type BlockWithParts } from './scope';

/**
 * Days after spraying until the follow-up visit falls due (common practice, from memory:
 * check a spray's effect within 3 to 7 days).
 */
export const FOLLOW_UP_DAYS = 5;

export interface Draft {
	decision: Decision;
	productId?: number | null;
	targetDate?: string | null;
	rescoutBy?: string | null;
	notes?: string | null;
}

export type SaveResult =
	| { ok: true; rec: Recommendation; warnings: RecommendationWarning[] }
	| { ok: false; field: string; message: string; warnings: RecommendationWarning[] };

const today = () => new Date().toISOString().slice(0, 10);
const STAFF = ['agronomist', 'admin'];

function staffOnly(user: SessionUser) {
	if (!STAFF.includes(user.role))
		error(403, {
			message: 'Only agronomists and administrators give recommendations.',
			code: 'forbidden'
		});
}

/** The warnings a draft raises on a block, without writing anything. */
export async function previewWarnings(
	user: SessionUser,
	block: BlockWithParts,
	d: Draft,
	exceptId: number | null,
	t?: Transaction
): Promise<{ product: Product | null; warnings: RecommendationWarning[]; field?: string }> {
	if (d.decision !== 'treat') return { product: null, warnings: [] };
	const product = d.productId
		? await Product.findOne({
				where: { id: d.productId, organisationId: user.organisationId, active: true },
				transaction: t
			})
		: null;
	if (!product) return { product: null, warnings: [], field: 'productId' };
	const ctx = await checkContext(block, exceptId, t);
	return { product, warnings: treatmentWarnings(product, d.targetDate ?? today(), ctx) };
}

/**
 * Saves a recommendation as a draft, or issues it. Issuing with warnings needs
 * `confirmWarnings`: the warnings are shown and recorded, never silently dropped. One
 * transaction: the row, its audit entry and the hand-over to alerts commit together.
 */
export async function saveRecommendation(
	user: SessionUser,
	blockId: number | string,
	d: Draft,
	opts: { issue: boolean; confirmWarnings?: boolean; draftId?: number }
): Promise<SaveResult> {
	staffOnly(user);
	return db().transaction(async (t) => {
		const block = await blockFor(user, blockId, t);
		const check = await previewWarnings(user, block, d, opts.draftId ?? null, t);
		if (check.field)
			return {
				ok: false,
				field: 'productId',
				message: "Choose a product from your organisation's list.",
				warnings: []
			};
		const { warnings, product } = check;
		if (opts.issue && warnings.length && !opts.confirmWarnings) {
			return {
				ok: false,
				field: 'confirmWarnings',
				message:
					'Read the warnings below, then tick the box to issue the recommendation with them.',
				warnings
			};
		}
		const latest = await Assessment.findOne({
			where: { blockId: block.id },
			order: [
				['computedAt', 'DESC'],
				['id', 'DESC']
			],
			attributes: ['id'],
			transaction: t
		});
		const values = {
			decision: d.decision,
			productId: product?.id ?? null,
			targetDate: d.decision === 'treat' ? (d.targetDate ?? null) : null,
			rescoutBy: d.decision === 'rescout' ? (d.rescoutBy ?? null) : d.rescoutBy || null,
			notes: d.notes || null,
			warnings,
			assessmentId: latest?.id ?? null
		};
		let rec: Recommendation;
		if (opts.draftId) {
			const found = await recommendationFor(user, opts.draftId, t);
			if (found.rec.blockId !== block.id || found.rec.status !== 'draft')
				return { ok: false, field: 'decision', message: 'Only a draft can be changed.', warnings };
			rec = await found.rec.update(values, { transaction: t });
		} else {
			rec = await Recommendation.create(
				{ ...values, organisationId: block.organisationId, blockId: block.id, authorId: user.id },
				{ transaction: t }
			);
		}
		await audit(
			{
				organisationId: block.organisationId,
				actorId: user.id,
				action: opts.draftId ? 'draft-changed' : 'drafted',
				entity: 'recommendation',
				entityId: rec.id,
				details: { blockId: block.id, decision: d.decision, product: product?.name ?? null }
			},
			t
		);
		if (opts.issue) await issue(user, rec, block, warnings, t);
		return { ok: true, rec, warnings };
	});
}

async function issue(
	user: SessionUser,
	rec: Recommendation,
	block: BlockWithParts,
	warnings: RecommendationWarning[],
	t: Transaction
) {
	const followUp =
		rec.decision === 'rescout'
			? rec.rescoutBy
			: rec.decision === 'treat'
				? null
				: isoPlusDays(today(), block.rescoutDays);
	await rec.update(
		{ status: 'issued', issuedAt: new Date(), warnings, followUpDue: followUp },
		{ transaction: t }
	);
	await audit(
		{
			organisationId: block.organisationId,
			actorId: user.id,
			action: 'issued',
			entity: 'recommendation',
			entityId: rec.id,
			details: { blockId: block.id, decision: rec.decision, warnings: warnings.map((w) => w.code) }
		},
		t
	);
	await recommendationIssued({
		recommendationId: rec.id,
		blockId: block.id,
		organisationId: block.organisationId,
		actorId: user.id,
		transaction: t
	});
}

/** Issues a saved draft; the checks run again, as things may have changed since it was saved. */
export async function issueDraft(user: SessionUser, id: number, confirmWarnings: boolean) {
	staffOnly(user);
	const found = await db().transaction((t) => recommendationFor(user, id, t));
	if (found.rec.status !== 'draft')
		return { ok: false as const, message: 'Only a draft can be issued.' };
	const r = found.rec;
	const res = await saveRecommendation(
		user,
		r.blockId,
		{
			decision: r.decision,
			productId: r.productId,
			targetDate: r.targetDate,
			rescoutBy: r.rescoutBy,
			notes: r.notes
		},
		{ issue: true, confirmWarnings, draftId: r.id }
	);
	return res.ok ? { ok: true as const } : { ok: false as const, message: res.message };
}

type Change = { ok: true } | { ok: false; message: string };

/** The grower confirms they have read an issued recommendation. */
export async function acknowledge(user: SessionUser, id: number): Promise<Change> {
	if (user.role !== 'grower')
		error(403, { message: 'Only the grower acknowledges a recommendation.', code: 'forbidden' });
	return db().transaction(async (t) => {
		const { rec, block } = await recommendationFor(user, id, t);
		if (rec.status !== 'issued')
			return { ok: false, message: `This recommendation is ${rec.status}, not waiting for you.` };
		await rec.update(
			{ status: 'acknowledged', acknowledgedAt: new Date(), acknowledgedBy: user.id },
			{ transaction: t }
		);
		await audit(
			{
				organisationId: block.organisationId,
				actorId: user.id,
				action: 'acknowledged',
				entity: 'recommendation',
				entityId: rec.id,
				details: { blockId: block.id }
			},
			t
		);
		return { ok: true };
	});
}

/** Records that the measure was carried out; the follow-up visit then falls due. */
export async function markApplied(
	user: SessionUser,
	id: number,
	appliedOn: string,
	appliedBy: string
): Promise<Change> {
	if (![...STAFF, 'grower'].includes(user.role)) error(403, 'Not open to your role.');
	return db().transaction(async (t) => {
		const { rec, block } = await recommendationFor(user, id, t);
		if (rec.status !== 'issued' && rec.status !== 'acknowledged')
			return { ok: false, message: `A ${rec.status} recommendation cannot be marked applied.` };
		if (rec.decision === 'no-action' || rec.decision === 'rescout')
			return { ok: false, message: 'There is nothing to apply for this decision.' };
		const followUpDue = isoPlusDays(appliedOn, FOLLOW_UP_DAYS);
		await rec.update({ status: 'applied', appliedOn, appliedBy, followUpDue }, { transaction: t });
		await audit(
			{
				organisationId: block.organisationId,
				actorId: user.id,
				action: 'applied',
				entity: 'recommendation',
				entityId: rec.id,
				details: { blockId: block.id, appliedOn, appliedBy, followUpDue }
			},
			t
		);
		return { ok: true };
	});
}

/** Withdraws a draft or an open recommendation. */
export async function withdraw(user: SessionUser, id: number): Promise<Change> {
	staffOnly(user);
	return db().transaction(async (t) => {
		const { rec, block } = await recommendationFor(user, id, t);
		if (!['draft', 'issued', 'acknowledged'].includes(rec.status))
			return { ok: false, message: `A ${rec.status} recommendation cannot be withdrawn.` };
		const from = rec.status;
		await rec.update({ status: 'withdrawn', followUpDue: null }, { transaction: t });
		await audit(
			{
				organisationId: block.organisationId,
				actorId: user.id,
				action: 'withdrawn',
				entity: 'recommendation',
				entityId: rec.id,
				details: { blockId: block.id, from }
			},
			t
		);
		return { ok: true };
	});
}
