import { describe, expect, it } from 'vitest';
import { differenceInCalendarDays, parseISO } from 'date-fns';
import { dayNumber, isoPlusDays, shortDate } from './dates';
import { quickNextDay } from './degreeDays';
import { EngineInputError } from './errors';

describe('dates', () => {
	it('day numbers agree with Date.UTC and with date-fns differences', () => {
		for (const iso of ['1970-01-01', '2000-02-29', '2024-12-31', '2025-03-01', '2100-03-01']) {
			expect(dayNumber(iso, 'd')).toBe(Date.parse(`${iso}T00:00:00Z`) / 86_400_000);
		}
		expect(dayNumber('2025-07-14', 'd') - dayNumber('2025-01-01', 'd')).toBe(
			differenceInCalendarDays(parseISO('2025-07-14'), parseISO('2025-01-01'))
		);
	});

	it('rejects what is not a calendar date, naming the field', () => {
		for (const bad of ['2025-02-29', '2025-13-01', '2025-7-1', '2025-07-00', 'today', 20250701]) {
			expect(() => dayNumber(bad, 'asOf')).toThrow(EngineInputError);
		}
	});

	it('adds calendar days and formats short dates', () => {
		expect(isoPlusDays('2025-07-09', 3)).toBe('2025-07-12');
		expect(isoPlusDays('2024-02-28', 1)).toBe('2024-02-29');
		expect(shortDate('2025-07-14')).toBe('14 Jul');
	});
});

describe('quickNextDay', () => {
	it('takes the fast path only where the successor is certain', () => {
		const d = dayNumber('2025-02-27', 'd');
		expect(quickNextDay('2025-02-28', '2025-02-27', d)).toBe(d + 1);
		expect(quickNextDay('2025-02-29', '2025-02-28', d + 1)).toBe(-1);
		expect(quickNextDay('2025-03-01', '2025-02-28', d + 1)).toBe(-1);
		expect(quickNextDay('2025-02-2x', '2025-02-27', d)).toBe(-1);
	});
});
