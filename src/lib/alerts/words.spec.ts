import { describe, expect, it } from 'vitest';
import { LEVEL_KEYS } from '$lib/domain';
import { OVERDUE_KIND } from '$lib/server/alerts/overdueAlerts';
import { ALERT_KINDS, KIND_WORDS } from './words';

// The alert log filters by kind with this list, so every kind a producer writes must be in it.
describe('alert kinds', () => {
	it('names every kind the outbox producers write', () => {
		const written = [
			...LEVEL_KEYS.map((l) => `level-${l}`), // levelAlerts.ts
			'recommendation', // recommendationAlerts.ts
			OVERDUE_KIND,
			'digest' // digest.ts
		];
		expect([...ALERT_KINDS].sort()).toEqual(written.sort());
		for (const k of ALERT_KINDS) expect(KIND_WORDS[k]).toMatch(/\w/);
	});
});
