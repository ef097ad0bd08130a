import type { CropParams, SampleUnitDef } from '../types';
import { GLUCOSE_REQ, v } from './sourced';

const LB = 0.45359237;
const BUSHEL = 'standard bushel weight (USDA), from memory';
const STAND = 'typical stand, from memory; set plants per ha on each block';
const analogue = (what: string, src: string) => `no value found; taken as ${what} (${src})`;

/** Default crop parameters; the seed loads them into the database for agronomists to edit. */
export const CROPS: CropParams[] = [
	{
		code: 'soybean',
		name: 'Soybean',
		harvestedOrgan: 'seed',
		glucoseReqGPerG: v(2.0, GLUCOSE_REQ.computed, 'computed'),
		bushelKg: v(60 * LB, `60 lb ${BUSHEL}`, 'from memory'),
		defaultPlantsPerHa: v(350_000, 'stand used in the sugar-to-yield worked example', 'assumption')
	},
	{
		code: 'wheat',
		name: 'Wheat',
		harvestedOrgan: 'grain',
		glucoseReqGPerG: v(1.38, GLUCOSE_REQ.computed, 'computed'),
		bushelKg: v(60 * LB, `60 lb ${BUSHEL}`, 'from memory'),
		defaultPlantsPerHa: v(2_500_000, STAND, 'from memory')
	},
	{
		code: 'barley',
		name: 'Barley',
		harvestedOrgan: 'grain',
		glucoseReqGPerG: v(1.38, analogue("wheat grain's 1.38", GLUCOSE_REQ.computed), 'assumption'),
		bushelKg: v(48 * LB, `48 lb ${BUSHEL}`, 'from memory'),
		defaultPlantsPerHa: v(2_500_000, STAND, 'from memory')
	},
	{
		code: 'cotton',
		name: 'Cotton',
		harvestedOrgan: 'seed cotton',
		glucoseReqGPerG: v(
			2.16,
			analogue("peanut seed's 2.16 (oil-rich seed)", GLUCOSE_REQ.peanut),
			'assumption'
		),
		defaultPlantsPerHa: v(100_000, STAND, 'from memory')
	},
	{
		code: 'potato-seed',
		name: 'Potato (seed)',
		harvestedOrgan: 'tuber',
		glucoseReqGPerG: v(
			1.2,
			analogue("rice grain's 1.20 (starch-rich organ)", GLUCOSE_REQ.rice),
			'assumption'
		),
		defaultPlantsPerHa: v(40_000, STAND, 'from memory')
	},
	{
		code: 'potato-table',
		name: 'Potato (table)',
		harvestedOrgan: 'tuber',
		glucoseReqGPerG: v(
			1.2,
			analogue("rice grain's 1.20 (starch-rich organ)", GLUCOSE_REQ.rice),
			'assumption'
		),
		defaultPlantsPerHa: v(40_000, STAND, 'from memory')
	},
	{
		code: 'sugar-beet',
		name: 'Sugar beet',
		harvestedOrgan: 'root',
		glucoseReqGPerG: v(
			1.2,
			analogue("rice grain's 1.20 (carbohydrate store)", GLUCOSE_REQ.rice),
			'assumption'
		),
		defaultPlantsPerHa: v(100_000, STAND, 'from memory')
	},
	{
		code: 'pecan',
		name: 'Pecan',
		harvestedOrgan: 'nut',
		glucoseReqGPerG: v(
			2.16,
			analogue("peanut seed's 2.16 (oil-rich seed)", GLUCOSE_REQ.peanut),
			'assumption'
		),
		defaultPlantsPerHa: v(70, 'trees per ha, typical orchard, from memory', 'from memory')
	},
	{
		code: 'hop',
		name: 'Hop',
		harvestedOrgan: 'cone',
		glucoseReqGPerG: v(1.38, analogue("wheat grain's 1.38", GLUCOSE_REQ.computed), 'assumption'),
		defaultPlantsPerHa: v(2_000, STAND, 'from memory')
	},
	{
		code: 'field-pea',
		name: 'Field pea',
		harvestedOrgan: 'seed',
		glucoseReqGPerG: v(
			1.38,
			analogue("wheat grain's 1.38 (starch-rich seed)", GLUCOSE_REQ.computed),
			'assumption'
		),
		bushelKg: v(60 * LB, `60 lb ${BUSHEL}`, 'from memory'),
		defaultPlantsPerHa: v(800_000, STAND, 'from memory')
	},
	{
		code: 'canola',
		name: 'Canola',
		harvestedOrgan: 'seed',
		glucoseReqGPerG: v(
			2.16,
			analogue("peanut seed's 2.16 (oil-rich seed)", GLUCOSE_REQ.peanut),
			'assumption'
		),
		bushelKg: v(50 * LB, `50 lb ${BUSHEL}`, 'from memory'),
		defaultPlantsPerHa: v(500_000, STAND, 'from memory')
	}
];

/** Sample units scouts examine. Units per plant are left for the block where they vary. */
export const SAMPLE_UNITS: SampleUnitDef[] = [
	{ code: 'plant', name: 'Whole plant', unitsPerPlantDefault: 1 },
	{ code: 'tiller', name: 'Tiller (stem)' },
	{ code: 'ear', name: 'Ear (head)' },
	{ code: 'leaf', name: 'Leaf (cotton: 5th main-stem leaf)' },
	{ code: 'compound-leaf', name: 'Compound leaf' },
	{ code: 'plant-tip', name: 'Plant tip (terminal)' },
	{ code: 'sweep', name: 'Sweep of a net' },
	{ code: 'trap', name: 'Yellow sticky trap or water pan' }
];
