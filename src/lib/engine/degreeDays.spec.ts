import { describe, expect, it } from 'vitest';
import {
	cumulativeDd,
	ddAt,
	ddCelsiusToFahrenheit,
	recentDdPerDay,
	singleSineDd
} from './degreeDays';
import { EngineInputError } from './errors';

describe('single-sine degree-days (Baskerville and Emin 1969, Ecology 50:514)', () => {
	it('matches the computed checks', () => {
		// Computed by hand from the method; a microclimate package's documentation gives 0.47.
		expect(singleSineDd(7, 14, 12)).toBeCloseTo(0.468, 3);
		expect(singleSineDd(5, 25, 10)).toBeCloseTo(6.09, 2);
		expect(singleSineDd(10, 30, 10)).toBeCloseTo(10.0, 6);
		expect(singleSineDd(15, 35, 10, 30)).toBeCloseTo(13.91, 2);
	});

	it('gives zero below the base and handles a constant day', () => {
		expect(singleSineDd(2, 8, 10)).toBe(0);
		expect(singleSineDd(15, 15, 10)).toBe(5);
	});

	it('rejects a minimum above the maximum, naming the field', () => {
		expect(() => singleSineDd(20, 10, 10)).toThrow(EngineInputError);
		try {
			cumulativeDd(
				[
					{ date: '2025-06-01', tminC: 10, tmaxC: 20 },
					{ date: '2025-06-02', tminC: 22, tmaxC: 18 }
				],
				10
			);
			expect.unreachable();
		} catch (e) {
			expect((e as EngineInputError).field).toBe('weather[1].tminC');
		}
	});

	it('accumulates consecutive days and rejects gaps', () => {
		const s = cumulativeDd(
			[
				{ date: '2025-06-01', tminC: 10, tmaxC: 30 },
				{ date: '2025-06-02', tminC: 10, tmaxC: 30 }
			],
			10
		);
		expect(ddAt(s, s.firstDay + 1)).toBeCloseTo(20, 9);
		expect(recentDdPerDay(s, s.firstDay + 1)).toBeCloseTo(10, 9);
		expect(() =>
			cumulativeDd(
				[
					{ date: '2025-06-01', tminC: 1, tmaxC: 2 },
					{ date: '2025-06-03', tminC: 1, tmaxC: 2 }
				],
				0
			)
		).toThrow(/consecutive/);
	});

	it('converts degree-days to Fahrenheit degree-days by 9/5 (common practice)', () => {
		expect(ddCelsiusToFahrenheit(100)).toBe(180);
	});
});
