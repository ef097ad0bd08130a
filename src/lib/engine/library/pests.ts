import type { PestParams } from '../types';
import { feeding, MASS_PLACEHOLDER, v } from './sourced';

const NO_BASE = 'no base temperature found; green peach aphid 4 degC used as a placeholder, edit';
const placeholderBase = v(4, NO_BASE, 'assumption');

/** Default pest parameters; every value carries its source and provenance. */
export const PESTS: PestParams[] = [
	{
		code: 'soybean-aphid',
		name: 'Soybean aphid',
		scientificName: 'Aphis glycines',
		baseTempC: v(
			8.6,
			'Iowa State extension, citing McCornack, Ragsdale and Venette 2004 (citation from memory)',
			'published'
		),
		feeding: feeding(0.2, MASS_PLACEHOLDER, false),
		yieldLoss: {
			kind: 'percent-per-cad',
			value: v(
				6.88 / 10_000,
				'6.88 % per 10,000 CAD, Minnesota research via a Canadian grain-extension page (Ragsdale et al. 2007, from memory)',
				'published'
			)
		},
		doublingDaysRef: v(
			6.8,
			'Ragsdale et al. 2007, J. Econ. Entomol. 100:1258 (field, 6.8 +/- 0.8 days)',
			'published'
		)
	},
	{
		code: 'bird-cherry-oat-aphid',
		name: 'Bird cherry-oat aphid',
		scientificName: 'Rhopalosiphum padi',
		baseTempC: placeholderBase,
		feeding: feeding(0.2, MASS_PLACEHOLDER, false)
	},
	{
		code: 'greenbug',
		name: 'Greenbug',
		scientificName: 'Schizaphis graminum',
		baseTempC: placeholderBase,
		feeding: feeding(0.2, MASS_PLACEHOLDER, false),
		yieldLoss: {
			kind: 'kg-per-aphid-per-unit',
			value: v(
				14.5,
				'Kindler et al. 2003, Southwest. Entomol. 28:163: 14.5 kg/ha per aphid per stem (34.3 under drought)',
				'published'
			)
		}
	},
	{
		code: 'grain-aphid',
		name: 'English grain aphid',
		scientificName: 'Sitobion avenae',
		baseTempC: placeholderBase,
		feeding: feeding(0.2, MASS_PLACEHOLDER, false)
	},
	{
		code: 'cotton-aphid',
		name: 'Cotton aphid',
		scientificName: 'Aphis gossypii',
		baseTempC: v(
			7,
			'midpoint of 6-8 degC by instar, Xia, van der Werf and Rabbinge 1999, Entomol. Exp. Appl. 90:25',
			'assumption'
		),
		feeding: feeding(0.2, MASS_PLACEHOLDER, false),
		doublingDaysRef: v(
			1.8,
			'Xia, van der Werf and Rabbinge 1999: r = 0.386 per day at 25 degC',
			'published'
		)
	},
	{
		code: 'green-peach-aphid',
		name: 'Green peach aphid',
		scientificName: 'Myzus persicae',
		baseTempC: v(
			4,
			'Am. Potato J. (authors from memory): generation 135.7 degree-days above 4 degC',
			'published'
		),
		feeding: feeding(0.2, MASS_PLACEHOLDER, false),
		ddPerGeneration: v(135.7, 'Am. Potato J. (authors from memory)', 'published')
	},
	{
		code: 'yellow-pecan-aphids',
		name: 'Yellow pecan aphids',
		scientificName: 'Monelliopsis pecanis and Monellia caryella',
		baseTempC: placeholderBase,
		feeding: feeding(0.2, MASS_PLACEHOLDER, false)
	},
	{
		code: 'black-pecan-aphid',
		name: 'Black pecan aphid',
		scientificName: 'Melanocallis caryaefoliae',
		baseTempC: placeholderBase,
		feeding: feeding(0.2, MASS_PLACEHOLDER, false)
	},
	{
		code: 'hop-aphid',
		name: 'Hop aphid',
		scientificName: 'Phorodon humuli',
		baseTempC: placeholderBase,
		feeding: feeding(0.2, MASS_PLACEHOLDER, false)
	},
	{
		code: 'pea-aphid',
		name: 'Pea aphid',
		scientificName: 'Acyrthosiphon pisum',
		baseTempC: placeholderBase,
		// Rates measured on this species; mass still an assumption.
		feeding: feeding(0.2, MASS_PLACEHOLDER, true)
	},
	{
		code: 'cabbage-aphid',
		name: 'Cabbage aphid',
		scientificName: 'Brevicoryne brassicae',
		baseTempC: placeholderBase,
		feeding: feeding(0.2, MASS_PLACEHOLDER, false)
	}
];
