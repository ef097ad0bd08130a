import { describe, expect, it } from 'vitest';
import { inQuietHours, localTime, parseHhmm, releaseAfterQuiet } from './quiet';

describe('quiet hours', () => {
	it('reads HH:MM and refuses anything else', () => {
		expect(parseHhmm('06:30')).toBe(390);
		expect(parseHhmm('24:00')).toBeNull();
		expect(parseHhmm('6:30')).toBeNull();
		expect(parseHhmm(null)).toBeNull();
	});

	it('handles windows across midnight and within a day', () => {
		expect(inQuietHours(22 * 60, 21 * 60, 390)).toBe(true);
		expect(inQuietHours(3 * 60, 21 * 60, 390)).toBe(true);
		expect(inQuietHours(12 * 60, 21 * 60, 390)).toBe(false);
		expect(inQuietHours(13 * 60, 12 * 60, 14 * 60)).toBe(true);
		expect(inQuietHours(15 * 60, 12 * 60, 14 * 60)).toBe(false);
		expect(inQuietHours(15 * 60, 600, 600)).toBe(false);
	});

	it('holds a 3 a.m. message until the local end of quiet hours', () => {
		// 2026-07-01 03:10 in Chicago is 08:10 UTC (CDT, UTC-5).
		const now = new Date('2026-07-01T08:10:00Z');
		const at = releaseAfterQuiet(now, 'America/Chicago', '21:00', '06:30');
		expect(at.toISOString()).toBe('2026-07-01T11:30:00.000Z');
		expect(localTime(at, 'America/Chicago').minute).toBe(390);
	});

	it('sends at once outside quiet hours or without them', () => {
		const noon = new Date('2026-07-01T17:00:00Z');
		expect(releaseAfterQuiet(noon, 'America/Chicago', '21:00', '06:30')).toBe(noon);
		expect(releaseAfterQuiet(noon, 'America/Chicago', null, null)).toBe(noon);
	});

	it('lands on the local end time across a clock change', () => {
		// US clocks go back on 2026-11-01 at 02:00 CDT; 23:00 CDT on 31 Oct is 04:00 UTC.
		const at = releaseAfterQuiet(
			new Date('2026-11-01T04:00:00Z'),
			'America/Chicago',
			'21:00',
			'06:30'
		);
		expect(localTime(at, 'America/Chicago')).toMatchObject({ date: '2026-11-01', minute: 390 });
		expect(at.toISOString()).toBe('2026-11-01T12:30:00.000Z');
	});

	it('lands on the local end time when the clock goes forward overnight', () => {
		// US clocks go forward on 2027-03-14 at 02:00 CST (second Sunday of March); 23:00 CST
		// on 13 March is 05:00 UTC, and 06:30 CDT the next morning is 11:30 UTC.
		const at = releaseAfterQuiet(
			new Date('2027-03-14T05:00:00Z'),
			'America/Chicago',
			'21:00',
			'06:30'
		);
		expect(at.toISOString()).toBe('2027-03-14T11:30:00.000Z');
		expect(localTime(at, 'America/Chicago')).toMatchObject({ date: '2027-03-14', minute: 390 });
	});

	it('waits within the same day when quiet hours do not cross midnight', () => {
		// 12:00-14:00 in Berlin (CEST, UTC+2): 12:30 local is 10:30 UTC, released 14:00 = 12:00 UTC.
		const at = releaseAfterQuiet(
			new Date('2026-07-01T10:30:00Z'),
			'Europe/Berlin',
			'12:00',
			'14:00'
		);
		expect(at.toISOString()).toBe('2026-07-01T12:00:00.000Z');
	});
});
