import { describe, expect, it } from 'vitest';
import { celsiusToFahrenheit, fahrenheitToCelsius } from './degreeDays';
import {
	buPerAcreToKgPerHa,
	galPerAcreToLPerHa,
	haToAcres,
	kgPerHaToBuPerAcre,
	lPerHaToGalPerAcre
} from './units';

describe('unit conversions', () => {
	it('uses the exact definitions (common practice)', () => {
		expect(haToAcres(1)).toBeCloseTo(2.4711, 4);
		expect(galPerAcreToLPerHa(1)).toBeCloseTo(9.354, 3);
		expect(lPerHaToGalPerAcre(galPerAcreToLPerHa(3.7))).toBeCloseTo(3.7, 12);
		expect(celsiusToFahrenheit(100)).toBe(212);
		expect(fahrenheitToCelsius(32)).toBe(0);
	});

	it('converts soybean yields with a 60 lb bushel (from memory): 60 bu/ac is about 4,035 kg/ha', () => {
		const bushelKg = 60 * 0.45359237;
		expect(buPerAcreToKgPerHa(60, bushelKg)).toBeCloseTo(4035, 0);
		expect(kgPerHaToBuPerAcre(4035.3, bushelKg)).toBeCloseTo(60, 2);
	});
});
