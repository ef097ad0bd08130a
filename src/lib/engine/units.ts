import { positive } from './errors';

// Exact by definition (international yard and pound, 1959; US liquid gallon = 231 in^3).
export const HA_PER_ACRE = 0.40468564224;
export const KG_PER_LB = 0.45359237;
export const L_PER_US_GALLON = 3.785411784;

export const haToAcres = (ha: number) => ha / HA_PER_ACRE;
export const acresToHa = (ac: number) => ac * HA_PER_ACRE;

/** Per-hectare rate to per-acre rate (plants, aphids, kg). */
export const perHaToPerAcre = (v: number) => v * HA_PER_ACRE;
export const perAcreToPerHa = (v: number) => v / HA_PER_ACRE;

export const lPerHaToGalPerAcre = (v: number) => (v * HA_PER_ACRE) / L_PER_US_GALLON;
export const galPerAcreToLPerHa = (v: number) => (v * L_PER_US_GALLON) / HA_PER_ACRE;

export const kgToLb = (kg: number) => kg / KG_PER_LB;
export const lbToKg = (lb: number) => lb * KG_PER_LB;

/** kg/ha to bushels per acre, with the crop's bushel weight in kg. */
export function kgPerHaToBuPerAcre(kgHa: number, bushelKg: number): number {
	return (kgHa * HA_PER_ACRE) / positive(bushelKg, 'bushelKg');
}

/** Bushels per acre to kg/ha, with the crop's bushel weight in kg. */
export function buPerAcreToKgPerHa(buAc: number, bushelKg: number): number {
	return (buAc * positive(bushelKg, 'bushelKg')) / HA_PER_ACRE;
}

export { celsiusToFahrenheit, fahrenheitToCelsius, ddCelsiusToFahrenheit } from './degreeDays';
