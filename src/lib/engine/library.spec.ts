import { describe, expect, it } from 'vitest';
import { CROPS, PESTS, SAMPLE_UNITS, THRESHOLDS } from './library';
import type { Provenance, Sourced } from './types';

const PROVENANCE: Provenance[] = [
	'published',
	'computed',
	'from memory',
	'common practice',
	'assumption'
];

function sourcedValues(x: unknown, out: Sourced<unknown>[] = []): Sourced<unknown>[] {
	if (x && typeof x === 'object') {
		if ('value' in x && 'source' in x && 'provenance' in x) out.push(x as Sourced<unknown>);
		else Object.values(x).forEach((v) => sourcedValues(v, out));
	}
	return out;
}

describe('parameter library', () => {
	it('gives every value a source and a provenance mark', () => {
		const all = sourcedValues([CROPS, PESTS]);
		expect(all.length).toBeGreaterThan(60);
		for (const s of all) {
			expect(s.source.length).toBeGreaterThan(3);
			expect(PROVENANCE).toContain(s.provenance);
		}
		for (const r of THRESHOLDS) {
			expect(r.source.length).toBeGreaterThan(3);
			expect(PROVENANCE).toContain(r.provenance);
		}
	});

	it('has thresholds only for known crops, pests and sample units, with sane stage ranges', () => {
		const crops = new Set(CROPS.map((c) => c.code));
		const pests = new Set(PESTS.map((p) => p.code));
		const units = new Set(SAMPLE_UNITS.map((u) => u.code));
		for (const r of THRESHOLDS) {
			expect(crops.has(r.cropCode), r.cropCode).toBe(true);
			expect(pests.has(r.pestCode), r.pestCode).toBe(true);
			expect(units.has(r.sampleUnit), r.sampleUnit).toBe(true);
			expect(r.bbchFrom).toBeLessThanOrEqual(r.bbchTo);
			if (r.metric === 'proportion') expect(r.action).toBeLessThan(1);
		}
	});

	it('covers the crops and pests the service starts with', () => {
		const pairs = new Set(THRESHOLDS.map((r) => `${r.cropCode}/${r.pestCode}`));
		for (const p of [
			'soybean/soybean-aphid',
			'wheat/bird-cherry-oat-aphid',
			'wheat/greenbug',
			'cotton/cotton-aphid',
			'potato-seed/green-peach-aphid',
			'potato-table/green-peach-aphid',
			'sugar-beet/green-peach-aphid',
			'pecan/yellow-pecan-aphids',
			'pecan/black-pecan-aphid',
			'hop/hop-aphid',
			'field-pea/pea-aphid',
			'canola/cabbage-aphid'
		]) {
			expect(pairs.has(p), p).toBe(true);
		}
	});

	it('keeps the published values for soybean, pea and green peach aphids', () => {
		const soy = THRESHOLDS.find((r) => r.cropCode === 'soybean')!;
		// Ragsdale et al. 2007, J. Econ. Entomol. 100:1258.
		expect([soy.action, soy.injury, soy.alsoProportion, soy.requiresRising]).toEqual([
			250,
			674,
			0.8,
			true
		]);
		const aphid = PESTS.find((p) => p.code === 'soybean-aphid')!;
		// McCornack, Ragsdale and Venette 2004 (citation from memory), via Iowa State extension.
		expect(aphid.baseTempC.value).toBe(8.6);
		// Ragsdale et al. 2007: field doubling time 6.8 ± 0.8 days.
		expect(aphid.doublingDaysRef!.value).toBe(6.8);
		// Body mass is unknown for soybean aphid: an assumption, as the worked example's 0.2 mg.
		expect(aphid.feeding.bodyMassMg).toMatchObject({ value: 0.2, provenance: 'assumption' });
		const pea = PESTS.find((p) => p.code === 'pea-aphid')!;
		// Rhodes, Croghan and Dixon 1996: measured on pea aphid.
		expect(pea.feeding.ingestionNlPerMgH).toMatchObject({ value: 12.4, provenance: 'published' });
		// Am. Potato J. (authors from memory): a generation takes 135.7 degree-days above 4 °C.
		expect(PESTS.find((p) => p.code === 'green-peach-aphid')!.ddPerGeneration!.value).toBe(135.7);
	});
});
