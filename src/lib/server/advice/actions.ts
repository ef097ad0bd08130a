import { fail, type RequestEvent } from '@sveltejs/kit';
import { appliedSchema, idSchema } from '$lib/schemas/advice';
import { requireRole } from '../guard';
import { acknowledge, issueDraft, markApplied, withdraw } from './recommendations';

/** Form fields as numbers where the schema wants them (plain forms, not superforms). */
async function fields(event: RequestEvent) {
	const fd = await event.request.formData();
	const o: Record<string, unknown> = {};
	for (const [k, v] of fd) o[k] = k === 'id' ? Number(v) : String(v);
	o.confirmWarnings = fd.get('confirmWarnings') === 'on';
	return o;
}

const issueFor = (id: unknown, message: string, field = 'form') =>
	fail(400, { rec: { id: Number(id) || 0, field, message } });

/**
 * The state changes of a recommendation, as form actions shared by the block page, the
 * grower's page and the list: issue a draft, withdraw, acknowledge, mark applied.
 */
export const recommendationActions = {
	issue: async (event: RequestEvent) => {
		const user = requireRole(event, 'agronomist', 'admin');
		const o = await fields(event);
		const p = idSchema.safeParse(o);
		if (!p.success) return issueFor(o.id, 'No recommendation was named.');
		const r = await issueDraft(user, p.data.id, o.confirmWarnings === true);
		return r.ok
			? { done: 'issued', id: p.data.id }
			: issueFor(p.data.id, r.message, 'confirmWarnings');
	},
	withdraw: async (event: RequestEvent) => {
		const user = requireRole(event, 'agronomist', 'admin');
		const o = await fields(event);
		const p = idSchema.safeParse(o);
		if (!p.success) return issueFor(o.id, 'No recommendation was named.');
		const r = await withdraw(user, p.data.id);
		return r.ok ? { done: 'withdrawn', id: p.data.id } : issueFor(p.data.id, r.message);
	},
	acknowledge: async (event: RequestEvent) => {
		const user = requireRole(event, 'grower');
		const o = await fields(event);
		const p = idSchema.safeParse(o);
		if (!p.success) return issueFor(o.id, 'No recommendation was named.');
		const r = await acknowledge(user, p.data.id);
		return r.ok ? { done: 'acknowledged', id: p.data.id } : issueFor(p.data.id, r.message);
	},
	applied: async (event: RequestEvent) => {
		const user = requireRole(event, 'agronomist', 'admin', 'grower');
		const o = await fields(event);
		const p = appliedSchema.safeParse(o);
		if (!p.success) {
			const first = p.error.issues[0];
			return issueFor(o.id, first.message, String(first.path[0] ?? 'form'));
		}
		const r = await markApplied(user, p.data.id, p.data.appliedOn, p.data.appliedBy);
		return r.ok ? { done: 'applied', id: p.data.id } : issueFor(p.data.id, r.message);
	}
};
