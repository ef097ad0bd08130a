import type { ThresholdRule } from '../types';
import { ANY, rule } from './rule';
import { CEREAL_THRESHOLDS } from './thresholdsCereal';

/**
 * Default action thresholds by crop, pest, sample unit and growth stage. BBCH ranges stand
 * for the stages the sources name (soybean R1-R5 as BBCH 60-79: mapping from memory); where a
 * source names no stage the rule spans BBCH 0-99.
 */
export const THRESHOLDS: ThresholdRule[] = [
	rule({
		cropCode: 'soybean',
		pestCode: 'soybean-aphid',
		bbchFrom: 60,
		bbchTo: 79,
		sampleUnit: 'plant',
		metric: 'mean',
		action: 250,
		injury: 674,
		requiresRising: true,
		alsoProportion: 0.8,
		label: '250 per plant, 80 % of plants infested and rising; injury level 674 per plant',
		source: 'Ragsdale et al. 2007, J. Econ. Entomol. 100:1258'
	}),
	...CEREAL_THRESHOLDS,
	rule({
		cropCode: 'cotton',
		pestCode: 'cotton-aphid',
		bbchFrom: 50,
		bbchTo: 79,
		sampleUnit: 'leaf',
		metric: 'mean',
		action: 50,
		label: 'about 50 per 5th main-stem leaf mid-season (40 plants)',
		source: 'UC IPM; Texas extension'
	}),
	rule({
		cropCode: 'cotton',
		pestCode: 'cotton-aphid',
		bbchFrom: 80,
		bbchTo: 99,
		sampleUnit: 'leaf',
		metric: 'mean',
		action: 10,
		label: 'about 10 per leaf after bolls open (honeydew on lint)',
		source: 'UC IPM; Texas extension'
	}),
	rule({
		cropCode: 'potato-seed',
		pestCode: 'green-peach-aphid',
		...ANY,
		sampleUnit: 'plant',
		metric: 'proportion',
		action: 0.1,
		label: '10 % of plants with aphids (or 1 winged green peach aphid)',
		source: 'University of Maine; UMass extension'
	}),
	rule({
		cropCode: 'potato-table',
		pestCode: 'green-peach-aphid',
		...ANY,
		sampleUnit: 'plant',
		metric: 'proportion',
		action: 0.5,
		label: '50 % of plants with aphids',
		source: 'University of Maine; UMass extension'
	}),
	rule({
		cropCode: 'potato-table',
		pestCode: 'green-peach-aphid',
		...ANY,
		sampleUnit: 'leaf',
		metric: 'mean',
		action: 5,
		label: '5 aphids per leaf',
		source: 'University of Maine; UMass extension'
	}),
	rule({
		cropCode: 'sugar-beet',
		pestCode: 'green-peach-aphid',
		bbchFrom: 10,
		bbchTo: 19,
		sampleUnit: 'plant',
		metric: 'mean',
		action: 0.25,
		label:
			'1 green wingless aphid per 4 plants, up to 12 true leaves (counts should be of wingless aphids)',
		source: 'UK beet research, as reported 2023'
	}),
	rule({
		cropCode: 'pecan',
		pestCode: 'yellow-pecan-aphids',
		...ANY,
		seasonFrom: '06-01',
		seasonTo: '08-15',
		sampleUnit: 'compound-leaf',
		metric: 'mean',
		action: 20,
		label: '20 per compound leaf, 1 Jun to 15 Aug (check the current guideline)',
		source: 'UC IPM (2010)'
	}),
	rule({
		cropCode: 'pecan',
		pestCode: 'yellow-pecan-aphids',
		...ANY,
		seasonFrom: '08-16',
		seasonTo: '12-31',
		sampleUnit: 'compound-leaf',
		metric: 'mean',
		action: 10,
		label: '10 per compound leaf after 15 Aug (check the current guideline)',
		source: 'UC IPM (2010)'
	}),
	rule({
		cropCode: 'pecan',
		pestCode: 'black-pecan-aphid',
		...ANY,
		sampleUnit: 'compound-leaf',
		metric: 'mean',
		action: 1,
		label: '1 per compound leaf',
		source: 'UC IPM; LSU'
	}),
	rule({
		cropCode: 'hop',
		pestCode: 'hop-aphid',
		...ANY,
		sampleUnit: 'leaf',
		metric: 'mean',
		action: 8,
		label: '8 to 10 per leaf',
		source: 'UVM extension'
	}),
	rule({
		cropCode: 'field-pea',
		pestCode: 'pea-aphid',
		bbchFrom: 70,
		bbchTo: 79,
		sampleUnit: 'sweep',
		metric: 'mean',
		action: 9,
		label: '9 to 12 per sweep at early pod',
		source: 'Manitoba study (Maiteki and Lamb 1985, from memory)',
		provenance: 'from memory'
	}),
	rule({
		cropCode: 'field-pea',
		pestCode: 'pea-aphid',
		bbchFrom: 70,
		bbchTo: 79,
		sampleUnit: 'plant-tip',
		metric: 'mean',
		action: 2,
		label: '2 to 3 per plant tip at early pod',
		source: 'Manitoba study (Maiteki and Lamb 1985, from memory)',
		provenance: 'from memory'
	}),
	rule({
		cropCode: 'canola',
		pestCode: 'cabbage-aphid',
		...ANY,
		sampleUnit: 'plant',
		metric: 'proportion',
		action: 0.2,
		label: '20 % of plants infested',
		source: 'Western Australia work, via Queensland extension'
	})
];
