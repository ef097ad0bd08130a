// Demo product lists. Names are generic (active ingredient + formulation); rates, REI and PHI are
// invented demo values, NOT taken from any label: the label on the container always rules.
type DemoProduct = {
	name: string;
	activeIngredient: string;
	iracGroup: string;
	rate: number;
	rateUnit: string;
	reiHours: number;
	phiDays: number;
	beeHazard: 'low' | 'moderate' | 'high';
	notes: string;
};

const note = 'Demo values only; read the product label for the real rate, REI and PHI.';

const base: DemoProduct[] = [
	{
		name: 'Lambda-cyhalothrin 250 CS',
		activeIngredient: 'lambda-cyhalothrin',
		iracGroup: '3A',
		rate: 40,
		rateUnit: 'mL/ha',
		reiHours: 24,
		phiDays: 30,
		beeHazard: 'high',
		notes: note
	},
	{
		name: 'Sulfoxaflor 240 SC',
		activeIngredient: 'sulfoxaflor',
		iracGroup: '4C',
		rate: 100,
		rateUnit: 'mL/ha',
		reiHours: 12,
		phiDays: 7,
		beeHazard: 'high',
		notes: note
	},
	{
		name: 'Flupyradifurone 200 SL',
		activeIngredient: 'flupyradifurone',
		iracGroup: '4D',
		rate: 500,
		rateUnit: 'mL/ha',
		reiHours: 4,
		phiDays: 21,
		beeHazard: 'moderate',
		notes: note
	},
	{
		name: 'Flonicamid 50 WG',
		activeIngredient: 'flonicamid',
		iracGroup: '29',
		rate: 140,
		rateUnit: 'g/ha',
		reiHours: 12,
		phiDays: 14,
		beeHazard: 'low',
		notes: note
	},
	{
		name: 'Afidopyropen 50 DC',
		activeIngredient: 'afidopyropen',
		iracGroup: '9D',
		rate: 100,
		rateUnit: 'mL/ha',
		reiHours: 12,
		phiDays: 7,
		beeHazard: 'low',
		notes: note
	},
	{
		name: 'Spirotetramat 240 SC',
		activeIngredient: 'spirotetramat',
		iracGroup: '23',
		rate: 300,
		rateUnit: 'mL/ha',
		reiHours: 24,
		phiDays: 21,
		beeHazard: 'moderate',
		notes: note
	},
	{
		name: 'Pirimicarb 50 WG',
		activeIngredient: 'pirimicarb',
		iracGroup: '1A',
		rate: 280,
		rateUnit: 'g/ha',
		reiHours: 24,
		phiDays: 14,
		beeHazard: 'moderate',
		notes: note
	},
	{
		name: 'Pymetrozine 50 WG',
		activeIngredient: 'pymetrozine',
		iracGroup: '9B',
		rate: 200,
		rateUnit: 'g/ha',
		reiHours: 12,
		phiDays: 14,
		beeHazard: 'low',
		notes: note
	}
];

export const DEMO_PRODUCTS: Record<'brackenridge' | 'ostrander', DemoProduct[]> = {
	brackenridge: base,
	ostrander: base.slice(0, 4)
};
