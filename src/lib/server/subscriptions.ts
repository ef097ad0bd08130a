import { verify } from '@node-rs/argon2';
import { error } from '@sveltejs/kit';
import { Op, QueryTypes, UniqueConstraintError } from 'sequelize';
import type { z } from 'zod';
import { parsePhone, phoneCountry } from '$lib/phone';
import type { contactSchema, subscriptionSchema } from '$lib/schemas/alerts';
import { audit } from './advice/audit';
import { db } from './db';
import { Subscription, User } from './db/models';

type SubscriptionInput = z.infer<typeof subscriptionSchema>;
type ContactInput = z.infer<typeof contactSchema>;
type Failure = { ok: false; field: string; message: string };

export interface ScopeFarm {
	id: number;
	name: string;
	blocks: { id: number; name: string }[];
}

/** Farms and blocks a person may subscribe to: a grower's own, everyone else's organisation's. */
export async function scopeOptions(user: SessionUser): Promise<ScopeFarm[]> {
	const own = user.role === 'grower' ? 'AND f.grower_id = :uid' : '';
	const rows = await db().query<{
		farmId: number;
		farm: string;
		blockId: number | null;
		block: string | null;
	}>(
		`SELECT f.id AS farmId, f.name AS farm, b.id AS blockId, b.name AS block
		   FROM farms f LEFT JOIN blocks b ON b.farm_id = f.id AND b.organisation_id = f.organisation_id
		  WHERE f.organisation_id = :org ${own}
		  ORDER BY f.name, f.id, b.name`,
		{ replacements: { org: user.organisationId, uid: user.id }, type: QueryTypes.SELECT }
	);
	const farms = new Map<number, ScopeFarm>();
	for (const r of rows) {
		const f = farms.get(r.farmId) ?? { id: r.farmId, name: r.farm, blocks: [] };
		farms.set(r.farmId, f);
		if (r.blockId && r.block) f.blocks.push({ id: r.blockId, name: r.block });
	}
	return [...farms.values()];
}

/** The scope field's value ('all', 'farm:ID', 'block:ID') as columns, if the person may use it. */
export function readScope(scope: string, options: ScopeFarm[]) {
	if (scope === 'all') return { farmId: null, blockId: null };
	const [kind, raw] = scope.split(':');
	const id = Number(raw);
	if (kind === 'farm' && options.some((f) => f.id === id)) return { farmId: id, blockId: null };
	if (kind === 'block' && options.some((f) => f.blocks.some((b) => b.id === id)))
		return { farmId: null, blockId: id };
	return null;
}

export const scopeOf = (s: { farmId: number | null; blockId: number | null }) =>
	s.blockId ? `block:${s.blockId}` : s.farmId ? `farm:${s.farmId}` : 'all';

const entry = (
	user: SessionUser,
	action: string,
	id: number,
	details: Record<string, unknown>
) => ({
	organisationId: user.organisationId,
	actorId: user.id,
	action,
	entity: 'subscription',
	entityId: id,
	details
});

/** Adds or changes one of the person's own subscriptions (another's id answers 404). */
export async function saveSubscription(
	user: SessionUser,
	input: SubscriptionInput
): Promise<{ ok: true; id: number } | Failure> {
	const scope = readScope(input.scope, await scopeOptions(user));
	if (!scope) return { ok: false, field: 'scope', message: 'Choose one of your farms or blocks' };
	const values = {
		channel: input.channel,
		...scope,
		minLevel: input.minLevel,
		quietStart: input.quietStart || null,
		quietEnd: input.quietEnd || null
	};
	return db().transaction(async (t) => {
		if (input.channel === 'sms') {
			const me = await User.findByPk(user.id, { transaction: t });
			if (!me?.phoneE164)
				return {
					ok: false as const,
					field: 'channel',
					message: 'Add your mobile number above before choosing text messages'
				};
		}
		if (input.id) {
			const s = await Subscription.findOne({
				where: { id: input.id, userId: user.id },
				transaction: t,
				lock: t.LOCK.UPDATE
			});
			if (!s) error(404, 'No such subscription.');
			await s.update(values, { transaction: t });
			await audit(entry(user, 'changed', s.id, values), t);
			return { ok: true as const, id: s.id };
		}
		const s = await Subscription.create({ ...values, userId: user.id }, { transaction: t });
		await audit(entry(user, 'added', s.id, values), t);
		return { ok: true as const, id: s.id };
	});
}

/** Pauses or resumes, or removes, one of the person's own subscriptions; false if not theirs. */
export async function changeSubscription(
	user: SessionUser,
	id: number,
	change: 'pause' | 'resume' | 'remove'
) {
	return db().transaction(async (t) => {
		const s = await Subscription.findOne({
			where: { id, userId: user.id },
			transaction: t,
			lock: t.LOCK.UPDATE
		});
		if (!s) return 'missing' as const;
		if (change === 'resume' && s.channel === 'sms') {
			const me = await User.findByPk(user.id, { transaction: t });
			if (!me?.phoneE164) return 'no-phone' as const;
		}
		const details = { channel: s.channel, scope: scopeOf(s) };
		if (change === 'remove') await s.destroy({ transaction: t });
		else await s.update({ active: change === 'resume' }, { transaction: t });
		await audit(entry(user, change === 'remove' ? 'removed' : change + 'd', id, details), t);
		return 'done' as const;
	});
}

/** The default country for the person's phone number: their organisation's. */
export async function countryOf(organisationId: number) {
	const [org] = await db().query<{ country: string | null }>(
		'SELECT country FROM organisations WHERE id = ?',
		{ replacements: [organisationId], type: QueryTypes.SELECT }
	);
	return phoneCountry(org?.country);
}

/**
 * Changes where the person's alerts go: the e-mail address (also their sign-in) and the mobile
 * number, stored as E.164. An empty number removes it and pauses their text subscriptions.
 */
export async function saveContact(
	user: SessionUser,
	input: ContactInput
): Promise<{ ok: true; phone: string | null } | Failure> {
	const country = await countryOf(user.organisationId);
	let phone: string | null = null;
	if (input.phone) {
		const p = parsePhone(input.phone, country);
		if (!p.ok) return { ok: false, field: 'phone', message: p.message };
		phone = p.e164;
	}
	return db().transaction(async (t) => {
		const clash = await User.findOne({
			where: { email: input.email, id: { [Op.ne]: user.id } },
			transaction: t
		});
		if (clash)
			return {
				ok: false as const,
				field: 'email',
				message: 'E-mail address: another account uses it'
			};
		const me = await User.findByPk(user.id, { transaction: t, lock: t.LOCK.UPDATE });
		if (!me) error(404, 'No such person.');
		const changed = {
			email: me.email !== input.email,
			phone: me.phoneE164 !== phone
		};
		// The e-mail address is also the sign-in: changing it takes the current password, so a
		// session left open on a shared phone cannot hand the account to another address.
		if (changed.email) {
			const refusal = await emailChangeRefused(me.passwordHash, input.currentPassword);
			if (refusal) return { ok: false as const, field: 'currentPassword', message: refusal };
		}
		try {
			await me.update({ email: input.email, phoneE164: phone }, { transaction: t });
		} catch (e) {
			// Someone else took the address between the check above and this write.
			if (e instanceof UniqueConstraintError)
				return {
					ok: false as const,
					field: 'email',
					message: 'E-mail address: another account uses it'
				};
			throw e;
		}
		let paused = 0;
		if (!phone)
			[paused] = await Subscription.update(
				{ active: false },
				{ where: { userId: user.id, channel: 'sms', active: true }, transaction: t }
			);
		// The audit says what changed, not the addresses themselves.
		if (changed.email || changed.phone)
			await audit(
				{
					organisationId: user.organisationId,
					actorId: user.id,
					action: 'contact-changed',
					entity: 'user',
					entityId: user.id,
					details: { ...changed, phoneRemoved: !phone && changed.phone, textsPaused: paused }
				},
				t
			);
		return { ok: true as const, phone };
	});
}

async function emailChangeRefused(hash: string | null, password: string) {
	if (!hash)
		return 'Current password: this account signs in by e-mail link only; ask an administrator to change its address';
	if (!password) return 'Current password: needed to change the address you sign in with';
	if (!(await verify(hash, password))) return 'Current password: does not match';
	return null;
}
