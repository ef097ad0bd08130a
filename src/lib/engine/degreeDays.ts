import { EngineInputError, finite } from './errors';
import { dayNumber, digits } from './dates';
import type { WeatherDay } from './types';

// Area above `threshold` under a sine through tmin..tmax over one day (Baskerville and Emin 1969).
function sineAbove(tmin: number, tmax: number, threshold: number): number {
	const m = (tmax + tmin) / 2;
	const a = (tmax - tmin) / 2;
	if (tmin >= threshold) return m - threshold;
	if (tmax <= threshold) return 0;
	const theta = Math.asin((threshold - m) / a);
	return ((m - threshold) * (Math.PI / 2 - theta) + a * Math.cos(theta)) / Math.PI;
}

/** Degree-days for one day, single-sine method, horizontal cutoff at `upper` if given. */
export function singleSineDd(tmin: number, tmax: number, base: number, upper?: number): number {
	finite(tmin, 'tminC');
	finite(tmax, 'tmaxC');
	finite(base, 'baseTempC');
	if (tmin > tmax) throw new EngineInputError('tminC', 'minimum is above the maximum temperature');
	if (upper === undefined) return sineAbove(tmin, tmax, base);
	finite(upper, 'upperTempC');
	if (upper <= base) throw new EngineInputError('upperTempC', 'must be above the base temperature');
	return sineAbove(tmin, tmax, base) - sineAbove(tmin, tmax, upper);
}

// Kept in this module: it runs once per weather day per block.
/**
 * Day number of `iso` if it is plainly the day after `prev` (day number `prevDay`), else -1 so
 * the caller does the full parse: a cheap check for long runs of daily weather.
 */
export function quickNextDay(iso: unknown, prev: string, prevDay: number): number {
	if (typeof iso !== 'string' || iso.length !== 10) return -1;
	for (let i = 0; i < 8; i++) if (iso.charCodeAt(i) !== prev.charCodeAt(i)) return -1;
	const d = digits(iso, 8, 10);
	// Days 2 to 28 exist in every month, so a same-month successor there needs no calendar.
	return d >= 2 && d <= 28 && d === digits(prev, 8, 10) + 1 ? prevDay + 1 : -1;
}

export interface DdSeries {
	firstDay: number;
	/** cumulative[i] = degree-days accumulated by the end of day firstDay + i. */
	cumulative: Float64Array;
}

/** Running degree-day sum over consecutive daily weather; gaps and disorder are errors. */
export function cumulativeDd(
	weather: readonly WeatherDay[],
	base: number,
	upper?: number
): DdSeries {
	if (weather.length === 0) throw new EngineInputError('weather', 'no days given');
	finite(base, 'baseTempC');
	if (upper !== undefined && !(finite(upper, 'upperTempC') > base)) {
		throw new EngineInputError('upperTempC', 'must be above the base temperature');
	}
	const firstDay = dayNumber(weather[0].date, 'weather[0].date');
	const cumulative = new Float64Array(weather.length);
	let sum = 0;
	for (let i = 0; i < weather.length; i++) {
		const w = weather[i];
		let day = i === 0 ? firstDay : quickNextDay(w.date, weather[i - 1].date, firstDay + i - 1);
		if (day < 0) day = dayNumber(w.date, `weather[${i}].date`);
		if (day !== firstDay + i) {
			throw new EngineInputError(`weather[${i}].date`, 'days must be consecutive and in order');
		}
		const { tminC, tmaxC } = w;
		if (!Number.isFinite(tminC)) finite(tminC, `weather[${i}].tminC`);
		if (!Number.isFinite(tmaxC)) finite(tmaxC, `weather[${i}].tmaxC`);
		if (tminC > tmaxC)
			throw new EngineInputError(`weather[${i}].tminC`, 'minimum is above the maximum temperature');
		sum +=
			sineAbove(tminC, tmaxC, base) - (upper === undefined ? 0 : sineAbove(tminC, tmaxC, upper));
		cumulative[i] = sum;
	}
	return { firstDay, cumulative };
}

/** Degree-days accumulated by the end of a day, or null outside the series. */
export function ddAt(s: DdSeries, day: number): number | null {
	const i = day - s.firstDay;
	return i >= 0 && i < s.cumulative.length ? s.cumulative[i] : null;
}

/** Mean degree-days per day over the last `days` days up to and including `day`. */
export function recentDdPerDay(s: DdSeries, day: number, days = 7): number | null {
	const end = Math.min(day, s.firstDay + s.cumulative.length - 1) - s.firstDay;
	if (end < 0) return null;
	const start = Math.max(-1, end - days);
	const span = end - start;
	const before = start < 0 ? 0 : s.cumulative[start];
	return span > 0 ? (s.cumulative[end] - before) / span : null;
}

export const celsiusToFahrenheit = (c: number) => (c * 9) / 5 + 32;
export const fahrenheitToCelsius = (f: number) => ((f - 32) * 5) / 9;
/** A degree-day total in degC-days to degF-days (an interval, so no 32 offset). */
export const ddCelsiusToFahrenheit = (dd: number) => (dd * 9) / 5;
