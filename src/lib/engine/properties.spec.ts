import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { assessBlock } from './assess';
import { isoPlusDays } from './dates';
import { EngineInputError } from './errors';
import { soybeanBlock } from './fixtures';
import { levelRank } from './levels';
import { summarizeSample } from './sample';
import type { VisitInput } from './types';

const counts = fc.array(fc.nat({ max: 2000 }), { minLength: 1, maxLength: 40 });
const series = fc.array(fc.tuple(fc.integer({ min: 1, max: 9 }), counts), {
	minLength: 1,
	maxLength: 8
});

function visitsFrom(s: [number, number[]][]): VisitInput[] {
	let day = 1;
	return s.map(([gap, c], i) => {
		day += gap;
		const mummies = i % 3 === 0 ? c[0] : undefined;
		return {
			date: isoPlusDays('2025-07-01', day),
			bbch: 65,
			sampleUnit: 'plant',
			units: c.map((aphids) => ({ aphids })),
			mummies
		};
	});
}

function allFinite(x: unknown): boolean {
	if (typeof x === 'number') return Number.isFinite(x);
	if (Array.isArray(x)) return x.every(allFinite);
	if (x && typeof x === 'object') return Object.values(x).every(allFinite);
	return true;
}

describe('engine properties', () => {
	it('the 95 % CI contains the mean', () => {
		fc.assert(
			fc.property(counts, (c) => {
				const s = summarizeSample({
					date: '2025-07-01',
					sampleUnit: 'leaf',
					units: c.map((aphids) => ({ aphids }))
				});
				if (s.ci95) expect(s.ci95[0] <= s.mean! && s.mean! <= s.ci95[1]).toBe(true);
			})
		);
	});

	it('no NaN or Infinity anywhere in an assessment of valid input', () => {
		fc.assert(
			fc.property(series, fc.integer({ min: 1, max: 14 }), (s, rescout) => {
				const a = assessBlock(
					soybeanBlock(visitsFrom(s), {
						block: {
							areaHa: 3,
							plantsPerHa: 300_000,
							rescoutDays: rescout,
							expectedYieldKgHa: 3000,
							pricePerKg: 0.5
						}
					})
				);
				expect(allFinite(a)).toBe(true);
			}),
			{ numRuns: 300 }
		);
	});

	it('never changes its input (the server hands the same visit objects to many runs)', () => {
		const freeze = <T>(o: T): T => {
			if (o && typeof o === 'object') {
				for (const v of Object.values(o)) freeze(v);
				Object.freeze(o);
			}
			return o;
		};
		fc.assert(
			fc.property(series, (s) => {
				const input = soybeanBlock(visitsFrom(s));
				const copy = structuredClone(input);
				// Modules are strict: a write to a frozen object throws.
				const a = assessBlock(freeze(input));
				expect(input).toEqual(copy);
				expect(assessBlock(copy)).toEqual(a);
			}),
			{ numRuns: 200 }
		);
	});

	it('more aphids on the latest visit never lower the level or the drain', () => {
		fc.assert(
			fc.property(series, fc.nat({ max: 500 }), fc.nat(), (s, extra, at) => {
				const base = visitsFrom(s);
				const more = structuredClone(base);
				const last = more[more.length - 1];
				last.units[at % last.units.length].aphids! += extra;
				const a = assessBlock(soybeanBlock(base));
				const b = assessBlock(soybeanBlock(more));
				expect(levelRank(b.level)).toBeGreaterThanOrEqual(levelRank(a.level));
				expect(b.sapDrain!.daily.sapLPerHaDay).toBeGreaterThanOrEqual(
					a.sapDrain!.daily.sapLPerHaDay
				);
				expect(b.sapDrain!.season.sapLPerHa).toBeGreaterThanOrEqual(
					a.sapDrain!.season.sapLPerHa - 1e-9
				);
			}),
			{ numRuns: 300 }
		);
	});

	it('each kind of invalid input throws EngineInputError naming its field', () => {
		type Mutation = [string, (x: ReturnType<typeof soybeanBlock>) => void, RegExp];
		const mutations: Mutation[] = [
			['negative mummies', (x) => (x.visits[0].mummies = -3), /^visits\[0\]\.mummies$/],
			['zero units', (x) => (x.visits[0].units = []), /^visits\[0\]\.units$/],
			['bad date', (x) => (x.visits[0].date = '2025-13-40'), /^(visits\[0\]\.date|asOf)$/],
			['out of order', (x) => x.visits.reverse(), /^visits\[\d+\]\.date$/],
			['no area', (x) => (x.block.areaHa = 0), /^block\.areaHa$/],
			[
				'predators',
				(x) => (x.visits[0].predators = { ladybeetle: 1.5 }),
				/^visits\[0\]\.predators\.ladybeetle$/
			],
			[
				'hot night',
				(x) => (x.weather = [{ date: x.visits[0].date, tminC: 30, tmaxC: 20 }]),
				/^weather\[0\]\.tminC$/
			],
			[
				'edited rule',
				(x) => (x.thresholds = [{ ...x.thresholds[0], action: -5 }]),
				/^thresholds\[0\]\.action$/
			]
		];
		fc.assert(
			fc.property(series, fc.constantFrom(...mutations), (s, [, mutate, field]) => {
				const input = soybeanBlock(visitsFrom(s));
				const before = input.visits.map((v) => v.date).join();
				mutate(input);
				if (input.visits.map((v) => v.date).join() === before && field.source.includes('date'))
					return;
				try {
					assessBlock(input);
					expect.unreachable('should have thrown');
				} catch (e) {
					expect(e).toBeInstanceOf(EngineInputError);
					expect((e as EngineInputError).field).toMatch(field);
				}
			})
		);
	});

	it('invalid counts always throw EngineInputError with a field', () => {
		const bad = fc.oneof(
			fc.constant(-1),
			fc.constant(2.5),
			fc.constant(Number.NaN),
			fc.constant(Number.POSITIVE_INFINITY),
			fc.double({ min: -1e6, max: -1e-6 })
		);
		fc.assert(
			fc.property(series, bad, fc.nat(), fc.nat(), (s, value, vi, ui) => {
				const visits = visitsFrom(s);
				const v = visits[vi % visits.length];
				v.units[ui % v.units.length].aphids = value;
				try {
					assessBlock(soybeanBlock(visits));
					expect.unreachable('should have thrown');
				} catch (e) {
					expect(e).toBeInstanceOf(EngineInputError);
					expect((e as EngineInputError).field).toMatch(/^visits\[\d+\]\.units\[\d+\]\.aphids$/);
				}
			})
		);
	});
});
