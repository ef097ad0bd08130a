// My alerts (contact details and subscriptions) and the alert log, through the built app's
// form actions and pages, as a browser without JavaScript would post them.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditLog, Subscription, User } from '../../src/lib/server/db/models';
import { call, signInCookie } from '../helpers/app';
import { soyIds } from '../helpers/advice';
import { logRow } from '../helpers/alertLog';
import { buildBlock, buildFarm, buildOrganisation, buildUser, closeTestDb } from '../helpers/db';

afterAll(closeTestDb);

type Person = Awaited<ReturnType<typeof buildUser>>;
const as = async (p: Person) => ({ cookie: await signInCookie(p.user.email, p.password) });
const post = async (p: Person, action: string, form: Record<string, string>) =>
	call(`/settings?/${action}`, { form, headers: await as(p) });
const get = async (p: Person, path: string) => call(path, { headers: await as(p) });

let w: {
	grower: Person;
	other: Person;
	agronomist: Person;
	farmId: number;
	blockId: number;
	otherFarmId: number;
};

beforeAll(async () => {
	const org = await buildOrganisation({ timezone: 'America/Chicago' });
	const grower = await buildUser('grower', org.id);
	const other = await buildUser('grower', org.id);
	const agronomist = await buildUser('agronomist', org.id);
	const farm = await buildFarm(org.id, grower.user.id);
	const block = await buildBlock(farm, await soyIds());
	const otherFarm = await buildFarm(org.id, other.user.id);
	w = {
		grower,
		other,
		agronomist,
		farmId: farm.id,
		blockId: block.id,
		otherFarmId: otherFarm.id
	};
});

const phoneOf = async (p: Person) => (await User.findByPk(p.user.id))!.phoneE164;

describe('where alerts go', () => {
	it('stores a national number as E.164 in the organisation country (US by default)', async () => {
		const res = await post(w.grower, 'contact', {
			email: w.grower.user.email,
			phone: '(701) 555-0123'
		});
		expect(res.status).toBe(200);
		expect(await res.text()).toContain('Saved where your alerts go.');
		// libphonenumber-js README style: '(213) 373-4253' in US reads as +12133734253.
		expect(await phoneOf(w.grower)).toBe('+17015550123');
		const page = await (await get(w.grower, '/settings')).text();
		expect(page).toContain('(701) 555-0123');
		expect(page).toContain('+17015550123');
	});

	it('reads national numbers with the organisation country when it has one', async () => {
		const org = await buildOrganisation({ country: 'GB', timezone: 'Europe/London' });
		const p = await buildUser('scout', org.id);
		const res = await post(p, 'contact', { email: p.user.email, phone: '07400 123456' });
		expect(res.status).toBe(200);
		// Google libphonenumber example GB mobile number (libphonenumber-js/mobile/examples).
		expect(await phoneOf(p)).toBe('+447400123456');
	});

	it('refuses a bad number or address naming the field, and changes nothing', async () => {
		const before = await User.findByPk(w.grower.user.id);
		for (const [form, message] of [
			[{ email: w.grower.user.email, phone: '5' }, 'Phone number is too short.'],
			[
				{ email: w.grower.user.email, phone: '(123) 456-7890' },
				'Phone number is not a valid number in United States'
			],
			[{ email: 'not-an-address', phone: '' }, 'E-mail address: enter a valid address'],
			[{ email: w.other.user.email, phone: '' }, 'E-mail address: another account uses it']
		] as const) {
			const res = await post(w.grower, 'contact', form);
			expect(res.status, JSON.stringify(form)).toBe(400);
			expect(await res.text()).toContain(message);
		}
		const after = await User.findByPk(w.grower.user.id);
		expect(after!.phoneE164).toBe(before!.phoneE164);
		expect(after!.email).toBe(before!.email);
	});

	it('changes the sign-in address only with the current password (common practice)', async () => {
		const org = await buildOrganisation();
		const p = await buildUser('grower', org.id);
		const next = `moved-${p.user.id}@example.test`;
		for (const [currentPassword, message] of [
			['', 'Current password: needed to change the address you sign in with'],
			['not-my-password', 'Current password: does not match']
		] as const) {
			const res = await post(p, 'contact', { email: next, phone: '', currentPassword });
			expect(res.status).toBe(400);
			const page = await res.text();
			expect(page).toContain(message);
			expect(page).not.toContain('not-my-password'); // never echoed back
		}
		expect((await User.findByPk(p.user.id))!.email).toBe(p.user.email);
		const ok = await post(p, 'contact', { email: next, phone: '', currentPassword: p.password });
		expect(ok.status).toBe(200);
		expect((await User.findByPk(p.user.id))!.email).toBe(next);
		expect(await signInCookie(next, p.password)).toBeTruthy();
	});

	it('audits a change without writing the number into the trail', async () => {
		const org = await buildOrganisation();
		const p = await buildUser('agronomist', org.id);
		await post(p, 'contact', { email: p.user.email, phone: '+1 213 373 4253' });
		const rows = await AuditLog.findAll({ where: { organisationId: org.id, entity: 'user' } });
		expect(rows).toHaveLength(1);
		expect(rows[0].action).toBe('contact-changed');
		expect(JSON.stringify(rows[0].details)).not.toContain('2133734253');
	});
});

describe('subscriptions', () => {
	const sms = (over: Record<string, string> = {}) => ({
		channel: 'sms',
		scope: `farm:${w.farmId}`,
		minLevel: 'action',
		quietStart: '21:00',
		quietEnd: '06:30',
		...over
	});

	it('adds, changes, pauses, resumes and removes one of your own, with an audit row each', async () => {
		await post(w.grower, 'contact', { email: w.grower.user.email, phone: '(701) 555-0123' });
		const add = await post(w.grower, 'save', sms());
		expect(add.status).toBe(303);
		const id = Number(new URL(add.headers.get('location')!, 'http://x').searchParams.get('saved'));
		let s = await Subscription.findByPk(id);
		expect(s).toMatchObject({
			userId: w.grower.user.id,
			channel: 'sms',
			farmId: w.farmId,
			blockId: null,
			minLevel: 'action',
			quietStart: '21:00',
			quietEnd: '06:30',
			active: true
		});
		const edit = await get(w.grower, `/settings?edit=${id}`);
		expect(edit.status).toBe(200);
		const change = await post(w.grower, 'save', {
			...sms({ scope: `block:${w.blockId}`, minLevel: 'severe', quietStart: '', quietEnd: '' }),
			id: String(id)
		});
		expect(change.status).toBe(303);
		s = await Subscription.findByPk(id);
		expect(s).toMatchObject({ farmId: null, blockId: w.blockId, minLevel: 'severe' });
		expect(s!.quietStart).toBeNull();
		expect((await post(w.grower, 'pause', { id: String(id) })).status).toBe(200);
		expect((await Subscription.findByPk(id))!.active).toBe(false);
		expect((await post(w.grower, 'resume', { id: String(id) })).status).toBe(200);
		expect((await Subscription.findByPk(id))!.active).toBe(true);
		expect((await post(w.grower, 'remove', { id: String(id) })).status).toBe(200);
		expect(await Subscription.findByPk(id)).toBeNull();
		const trail = await AuditLog.findAll({
			where: { entity: 'subscription', entityId: String(id) },
			order: [['id', 'ASC']]
		});
		expect(trail.map((a) => a.action)).toEqual([
			'added',
			'changed',
			'paused',
			'resumed',
			'removed'
		]);
	});

	it("answers 404 for another person's subscription and leaves it alone", async () => {
		const theirs = await Subscription.create({
			userId: w.other.user.id,
			channel: 'email',
			minLevel: 'stirring'
		});
		const id = String(theirs.id);
		expect((await get(w.grower, `/settings?edit=${id}`)).status).toBe(404);
		for (const action of ['pause', 'resume', 'remove'])
			expect((await post(w.grower, action, { id })).status, action).toBe(404);
		const save = await post(w.grower, 'save', {
			id,
			channel: 'email',
			scope: 'all',
			minLevel: 'calm'
		});
		expect(save.status).toBe(404);
		const after = await Subscription.findByPk(theirs.id);
		expect(after).toMatchObject({ userId: w.other.user.id, minLevel: 'stirring', active: true });
	});

	it('refuses bad fields by name and stores nothing', async () => {
		const count = () => Subscription.count({ where: { userId: w.grower.user.id } });
		const before = await count();
		for (const [form, message] of [
			[sms({ scope: `farm:${w.otherFarmId}` }), 'Choose one of your farms or blocks'],
			[sms({ quietEnd: '' }), 'Give both the start and the end of quiet hours, or neither'],
			[sms({ quietStart: '25:00' }), 'Use a time as HH:MM'],
			[sms({ quietEnd: '21:00' }), 'Quiet hours must end at another time than they start'],
			[sms({ minLevel: 'loud' }), 'Choose the lowest level worth an alert'],
			[sms({ channel: 'pigeon' }), 'Choose text message or e-mail']
		] as const) {
			const res = await post(w.grower, 'save', form);
			expect(res.status, JSON.stringify(form)).toBe(400);
			expect(await res.text()).toContain(message);
		}
		expect(await count()).toBe(before);
	});

	it('asks for a mobile number before a text-message alert', async () => {
		const org = await buildOrganisation();
		const p = await buildUser('agronomist', org.id);
		const res = await post(p, 'save', { channel: 'sms', scope: 'all', minLevel: 'action' });
		expect(res.status).toBe(400);
		expect(await res.text()).toContain(
			'Add your mobile number above before choosing text messages'
		);
		expect(await Subscription.count({ where: { userId: p.user.id } })).toBe(0);
	});

	it('will not resume a text alert once the number is gone, and says which field to fill', async () => {
		const org = await buildOrganisation();
		const p = await buildUser('agronomist', org.id);
		await post(p, 'contact', { email: p.user.email, phone: '+1 213 373 4253' });
		const add = await post(p, 'save', { channel: 'sms', scope: 'all', minLevel: 'action' });
		expect(add.status).toBe(303);
		const id = Number(new URL(add.headers.get('location')!, 'http://x').searchParams.get('saved'));
		await post(p, 'contact', { email: p.user.email, phone: '' }); // pauses text alerts
		expect((await Subscription.findByPk(id))!.active).toBe(false);
		const res = await post(p, 'resume', { id: String(id) });
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('Phone number: add your mobile number above');
		expect((await Subscription.findByPk(id))!.active).toBe(false);
	});
});

describe('alert log', () => {
	it("lists the organisation's messages with their states, and no one else's", async () => {
		const org = await buildOrganisation({ timezone: 'America/Chicago' });
		const agro = await buildUser('agronomist', org.id);
		const grower = await buildUser('grower', org.id);
		const farm = await buildFarm(org.id, grower.user.id, { name: 'Log Test Farm' });
		const block = await buildBlock(farm, await soyIds(), { name: 'Log Test Block' });
		const elsewhere = await buildOrganisation();
		const stranger = await buildUser('grower', elsewhere.id);
		const base = { organisationId: org.id, userId: grower.user.id, blockId: block.id };
		await logRow({ ...base, channel: 'sms', status: 'delivered', toAddress: '+17015550123' });
		await logRow({
			...base,
			channel: 'sms',
			status: 'failed',
			toAddress: '+17015550123',
			attempts: 6,
			lastError: 'provider 400: not a mobile number'
		});
		await logRow({ ...base, channel: 'email', status: 'pending', toAddress: grower.user.email });
		await logRow({
			organisationId: elsewhere.id,
			userId: stranger.user.id,
			channel: 'sms',
			status: 'delivered',
			toAddress: '+17015550199'
		});
		const html = await (await get(agro, '/alerts')).text();
		for (const word of ['Delivered', 'Gave up', 'Queued', 'Held until', 'Log Test Block'])
			expect(html).toContain(word);
		expect(html).toContain('provider 400: not a mobile number');
		expect(html).toContain('+1 ••••••••23');
		expect(html).not.toContain('+17015550123');
		expect(html).not.toContain(stranger.user.name);
		const failed = await (await get(agro, '/alerts?status=failed&channel=sms')).text();
		expect(failed).toContain('Gave up');
		expect(failed).not.toContain('data-status="delivered"');
	});

	it('names the parameter of a bad filter instead of failing', async () => {
		for (const [q, message] of [
			['status=lost', 'status: use one of pending'],
			['channel=fax', 'channel: use one of sms, email'],
			['from=2026-13-01', 'from: use a date as YYYY-MM-DD'],
			['from=2026-06-02&to=2026-06-01', 'to: must not be before from'],
			['older=yesterday', 'older: not a page position this log made'],
			['colour=red', 'colour: not a filter of this page']
		]) {
			const res = await get(w.agronomist, `/alerts?${q}`);
			expect(res.status, q).toBe(200);
			expect(await res.text(), q).toContain(message);
		}
	});
});
