import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ENDPOINTS, PAGES, PUBLIC, ALL_ROLES } from '../access';
import { call, type As } from '../helpers/app';
import { closeTestDb } from '../helpers/db';
import { demoIds, fill } from '../helpers/fixtures';
import { endpointRoutes, pageRoutes, urlFor } from '../helpers/routes';
import type { Role } from '../../src/lib/roles';

// One demo account per role, all in the main demo organisation (the viewer in its own).
const ACCOUNT: Record<Role, As> = {
	admin: 'admin',
	agronomist: 'agronomist',
	scout: 'scout',
	grower: 'grower',
	regional: 'regional'
};

let ids: Record<string, string> = {};
beforeAll(async () => {
	ids = await demoIds();
});
afterAll(closeTestDb);

describe('every route has an access rule', () => {
	it('lists every page of the route tree', () => {
		const missing = pageRoutes().filter((id) => !PAGES[id] && !PUBLIC[id]);
		expect(missing, 'pages with no entry in tests/access.ts').toEqual([]);
	});
	it('lists every endpoint of the route tree', () => {
		const missing = endpointRoutes().filter((k) => !ENDPOINTS[k] && !PUBLIC[k]);
		expect(missing, 'endpoints with no entry in tests/access.ts').toEqual([]);
	});
});

describe('pages refuse anonymous callers and wrong roles', () => {
	for (const [id, rule] of Object.entries(PAGES)) {
		it(id, async () => {
			const path = fill(rule.path ?? urlFor(id), ids);
			const anon = await call(path, { as: null });
			expect(anon.status, `anonymous ${path}`).toBe(303);
			expect(anon.headers.get('location')).toMatch(/^\/signin\?redirectTo=/);
			for (const role of ALL_ROLES) {
				const res = await call(path, { as: ACCOUNT[role] });
				const want = rule.roles.includes(role) ? 200 : 403;
				expect(res.status, `${role} ${path}`).toBe(want);
			}
		});
	}
});

describe('endpoints refuse anonymous callers and wrong roles', () => {
	for (const [key, rule] of Object.entries(ENDPOINTS)) {
		it(key, async () => {
			const [method, id] = key.split(' ');
			const path = fill(rule.path ?? urlFor(id), ids);
			const anon = await call(path, { as: null, method });
			expect(anon.status, `anonymous ${method} ${path}`).toBe(401);
			for (const role of ALL_ROLES) {
				if (rule.roles.includes(role) && method !== 'GET') continue; // writes are probed per feature
				const res = await call(path, { as: ACCOUNT[role], method });
				if (rule.roles.includes(role))
					expect(res.status, `${role} ${method} ${path}`).toBeLessThan(400);
				else expect(res.status, `${role} ${method} ${path}`).toBe(403);
			}
		});
	}
});
