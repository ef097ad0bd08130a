export * from './types';
export * from './errors';
export * from './levels';
export * from './stats';
export * from './sample';
export * from './binomial';
export * from './taylor';
export * from './sequential';
export * from './speedScout';
export * from './trend';
export * from './proportionTrend';
export * from './degreeDays';
export * from './cad';
export * from './sapDrain';
export * from './seasonDrain';
export * from './enemies';
export * from './rules';
export * from './forecast';
export * from './level';
export * from './assess';
export { fmtNum, fmtPct, trendPhrase } from './format';
export { dayNumber, isoPlusDays, shortDate } from './dates';
export {
	HA_PER_ACRE,
	KG_PER_LB,
	L_PER_US_GALLON,
	haToAcres,
	acresToHa,
	perHaToPerAcre,
	perAcreToPerHa,
	lPerHaToGalPerAcre,
	galPerAcreToLPerHa,
	kgToLb,
	lbToKg,
	kgPerHaToBuPerAcre,
	buPerAcreToKgPerHa
} from './units';
export * as library from './library';
