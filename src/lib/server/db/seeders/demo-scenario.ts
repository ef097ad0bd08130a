// The demo scenario: an invented river valley with invented farms, people and blocks. Every
// number here is demo data, chosen to look plausible; none is a published value.

export interface DemoBlock {
	name: string;
	crop: string;
	pest: string;
	/** Offset of the block's south-west corner from the farm, in km (east, north). */
	at: [number, number];
	/** Width and height in km. */
	size: [number, number];
	variety: string;
	plantsPerHa: number;
	yieldKgHa: number;
	pricePerKg: number;
	/** Aphids per unit at the first visit and daily growth rate of the demo population. */
	start: number;
	growth: number;
	/** The scout who walks it (a DEMO_PEOPLE key). */
	scout: string;
}

export interface DemoFarm {
	name: string;
	org: 'brackenridge' | 'ostrander';
	grower: string;
	locality: string;
	lat: number;
	lon: number;
	blocks: DemoBlock[];
}

export const REGION = 'Willowmere Valley';

const soy = (
	b: Partial<DemoBlock> & Pick<DemoBlock, 'name' | 'at' | 'start' | 'growth' | 'scout'>
): DemoBlock => ({
	crop: 'soybean',
	pest: 'soybean-aphid',
	size: [0.8, 0.6],
	variety: 'Demo RR 1.2',
	plantsPerHa: 350_000,
	yieldKgHa: 3_000,
	pricePerKg: 0.42,
	...b
});

export const FARMS: DemoFarm[] = [
	{
		name: 'Heronsbrook Farm',
		org: 'brackenridge',
		grower: 'grower1',
		locality: 'Heronsbrook Road',
		lat: 47.221,
		lon: -96.951,
		blocks: [
			soy({ name: 'North Forty', at: [0, 0.4], start: 6, growth: 0.105, scout: 'scout1' }),
			soy({ name: 'Creek Quarter', at: [1.0, 0.2], start: 2, growth: 0.06, scout: 'scout1' }),
			{
				name: 'Home Wheat',
				crop: 'wheat',
				pest: 'bird-cherry-oat-aphid',
				at: [0, -0.6],
				size: [0.7, 0.5],
				variety: 'Demo Hard Red',
				plantsPerHa: 2_500_000,
				yieldKgHa: 4_000,
				pricePerKg: 0.22,
				start: 0.4,
				growth: 0.07,
				scout: 'scout1'
			}
		]
	},
	{
		name: 'Calloway Bottoms',
		org: 'brackenridge',
		grower: 'grower2',
		locality: 'Calloway Ford',
		lat: 47.183,
		lon: -96.884,
		blocks: [
			soy({
				name: 'River Flat',
				at: [0, 0],
				size: [1.1, 0.7],
				start: 12,
				growth: 0.095,
				scout: 'scout2'
			}),
			{
				name: 'Seed Potatoes East',
				crop: 'potato-seed',
				pest: 'green-peach-aphid',
				at: [1.3, 0.1],
				size: [0.5, 0.4],
				variety: 'Demo Russet',
				plantsPerHa: 45_000,
				yieldKgHa: 40_000,
				pricePerKg: 0.2,
				start: 0.1,
				growth: 0.08,
				scout: 'scout2'
			},
			{
				name: 'Beet Strip',
				crop: 'sugar-beet',
				pest: 'green-peach-aphid',
				at: [0.2, -0.7],
				size: [0.9, 0.3],
				variety: 'Demo Sweet 9',
				plantsPerHa: 100_000,
				yieldKgHa: 70_000,
				pricePerKg: 0.05,
				start: 0.02,
				growth: 0.04,
				scout: 'scout2'
			}
		]
	},
	{
		name: 'Fennick Acres',
		org: 'brackenridge',
		grower: 'grower3',
		locality: 'Fennick Corner',
		lat: 47.262,
		lon: -96.832,
		blocks: [
			{
				name: 'Ridge Canola',
				crop: 'canola',
				pest: 'cabbage-aphid',
				at: [0, 0],
				size: [0.9, 0.6],
				variety: 'Demo Gold',
				plantsPerHa: 500_000,
				yieldKgHa: 2_200,
				pricePerKg: 0.5,
				start: 0.05,
				growth: 0.05,
				scout: 'scout1'
			},
			{
				name: 'Pea Field',
				crop: 'field-pea',
				pest: 'pea-aphid',
				at: [1.1, 0],
				size: [0.6, 0.6],
				variety: 'Demo Yellow',
				plantsPerHa: 850_000,
				yieldKgHa: 2_800,
				pricePerKg: 0.3,
				start: 1.5,
				growth: 0.09,
				scout: 'scout1'
			},
			soy({ name: 'South Soy', at: [0.3, -0.9], start: 1, growth: 0.03, scout: 'scout2' })
		]
	},
	{
		name: 'Brask Farm',
		org: 'ostrander',
		grower: 'coopGrower1',
		locality: 'Brask Lane',
		lat: 47.205,
		lon: -96.905,
		blocks: [
			soy({ name: 'Brask Soy West', at: [0, 0], start: 4, growth: 0.09, scout: 'coopScout' }),
			soy({ name: 'Brask Soy East', at: [1.0, 0], start: 3, growth: 0.07, scout: 'coopScout' })
		]
	},
	{
		name: 'Kettering Land',
		org: 'ostrander',
		grower: 'coopGrower2',
		locality: 'Kettering Hill',
		lat: 47.239,
		lon: -96.918,
		blocks: [soy({ name: 'Kettering Main', at: [0, 0], start: 8, growth: 0.1, scout: 'coopScout' })]
	},
	{
		name: 'Halloway Place',
		org: 'ostrander',
		grower: 'coopGrower3',
		locality: 'Halloway Slough',
		lat: 47.196,
		lon: -96.968,
		blocks: [soy({ name: 'Halloway Soy', at: [0, 0], start: 2, growth: 0.05, scout: 'coopScout' })]
	}
];

/** A block's corner ring from the farm point and the km offsets (closed, counter-clockwise). */
export function blockRing(farm: DemoFarm, b: DemoBlock): [number, number][] {
	const kmLat = 1 / 110.574;
	const kmLon = 1 / (111.32 * Math.cos((farm.lat * Math.PI) / 180));
	const x0 = farm.lon + b.at[0] * kmLon;
	const y0 = farm.lat + b.at[1] * kmLat;
	const x1 = x0 + b.size[0] * kmLon;
	const y1 = y0 + b.size[1] * kmLat;
	const r = (n: number) => Math.round(n * 1e6) / 1e6;
	return [
		[r(x0), r(y0)],
		[r(x1), r(y0)],
		[r(x1), r(y1)],
		[r(x0), r(y1)],
		[r(x0), r(y0)]
	];
}
