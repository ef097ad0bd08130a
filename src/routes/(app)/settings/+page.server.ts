import { error, fail, redirect } from '@sveltejs/kit';
import { QueryTypes } from 'sequelize';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { z } from 'zod';
import { countryName, displayPhone } from '$lib/phone';
import { contactSchema, subscriptionSchema } from '$lib/schemas/alerts';
import { db } from '$lib/server/db';
import { requireRole } from '$lib/server/guard';
import {
	changeSubscription,
	countryOf,
	saveContact,
	saveSubscription,
	scopeOf,
	scopeOptions
} from '$lib/server/subscriptions';
import type { Role } from '$lib/roles';

/** Everyone who can be sent alerts; the regional view gets none (it sees no grower's blocks). */
const ALERTED: Role[] = ['admin', 'agronomist', 'scout', 'grower'];
import type { Actions, PageServerLoad, RequestEvent } from './$types';

const contactAdapter = zod4(contactSchema);
const subscriptionAdapter = zod4(subscriptionSchema);

interface Row {
	id: number;
	channel: 'sms' | 'email';
	minLevel: 'calm' | 'stirring' | 'action' | 'severe';
	quietStart: string | null;
	quietEnd: string | null;
	active: number;
	farmId: number | null;
	blockId: number | null;
	farm: string | null;
	block: string | null;
}

/** The signed-in person's own alert subscriptions and the addresses they go to. */
export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ...ALERTED);
	const [rows, [me], [optOut], scopes, country] = await Promise.all([
		db().query<Row>(
			`SELECT s.id, s.channel, s.min_level AS minLevel, s.quiet_start AS quietStart,
			        s.quiet_end AS quietEnd, s.active, s.farm_id AS farmId, s.block_id AS blockId,
			        f.name AS farm, b.name AS block
			   FROM subscriptions s
			   LEFT JOIN farms f ON f.id = s.farm_id AND f.organisation_id = ?
			   LEFT JOIN blocks b ON b.id = s.block_id AND b.organisation_id = ?
			  WHERE s.user_id = ? ORDER BY s.channel, s.id`,
			{ replacements: [user.organisationId, user.organisationId, user.id], type: QueryTypes.SELECT }
		),
		db().query<{ email: string; phone: string | null }>(
			`SELECT email, phone_e164 AS phone FROM users WHERE id = ?`,
			{ replacements: [user.id], type: QueryTypes.SELECT }
		),
		db().query<{ n: number }>(
			`SELECT COUNT(*) AS n FROM sms_opt_outs o JOIN users u ON u.phone_e164 = o.phone_e164 WHERE u.id = ?`,
			{ replacements: [user.id], type: QueryTypes.SELECT }
		),
		scopeOptions(user),
		countryOf(user.organisationId)
	]);
	const subscriptions = rows.map((r) => ({ ...r, active: !!r.active, scope: scopeOf(r) }));
	const phone = me?.phone ? displayPhone(me.phone, country) : '';
	const contact = await superValidate({ email: me?.email ?? user.email, phone }, contactAdapter, {
		id: 'contact',
		errors: false
	});
	const editId = Number(event.url.searchParams.get('edit') ?? 0);
	let form = await superValidate(subscriptionAdapter, { id: 'subscription' });
	form.data = { ...form.data, channel: phone ? 'sms' : 'email', scope: 'all', minLevel: 'action' };
	if (editId) {
		const s = subscriptions.find((x) => x.id === editId);
		if (!s) error(404, 'No such subscription.');
		form = await superValidate(
			{
				id: s.id,
				channel: s.channel,
				scope: s.scope,
				minLevel: s.minLevel,
				quietStart: s.quietStart ?? '',
				quietEnd: s.quietEnd ?? ''
			},
			subscriptionAdapter,
			{ id: 'subscription', errors: false }
		);
	}
	return {
		subscriptions,
		scopes,
		countryName: countryName(country),
		e164: me?.phone ?? null,
		smsStopped: Number(optOut?.n ?? 0) > 0,
		contact,
		form,
		editing: editId || null
	};
};

const idOf = async (event: RequestEvent) =>
	z.coerce
		.number()
		.int()
		.positive()
		.safeParse((await event.request.formData()).get('id'));

async function change(event: RequestEvent, what: 'pause' | 'resume' | 'remove') {
	const user = requireRole(event, ...ALERTED);
	const id = await idOf(event);
	const r = id.success ? await changeSubscription(user, id.data, what) : 'missing';
	if (r === 'missing') error(404, 'No such subscription.');
	if (r === 'no-phone')
		return fail(400, {
			problem: 'Phone number: add your mobile number above before resuming text messages.'
		});
	return { done: { pause: 'Paused.', resume: 'Resumed.', remove: 'Removed.' }[what] };
}

export const actions: Actions = {
	contact: async (event) => {
		const user = requireRole(event, ...ALERTED);
		const form = await superValidate(event.request, contactAdapter, { id: 'contact' });
		if (!form.valid) return fail(400, { contact: form });
		const r = await saveContact(user, form.data);
		form.data.currentPassword = ''; // never sent back to the page
		if (!r.ok) return setError(form, r.field as 'phone', r.message);
		if (r.phone) form.data.phone = displayPhone(r.phone, await countryOf(user.organisationId));
		return { contact: form, done: 'Saved where your alerts go.' };
	},
	save: async (event) => {
		const user = requireRole(event, ...ALERTED);
		const form = await superValidate(event.request, subscriptionAdapter, { id: 'subscription' });
		if (!form.valid) return fail(400, { form });
		const r = await saveSubscription(user, form.data);
		if (!r.ok) return setError(form, r.field as 'scope', r.message);
		redirect(303, `/settings?saved=${r.id}`);
	},
	pause: (event) => change(event, 'pause'),
	resume: (event) => change(event, 'resume'),
	remove: (event) => change(event, 'remove')
};
