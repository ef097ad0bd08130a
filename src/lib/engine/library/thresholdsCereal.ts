import { ANY, rule } from './rule';

const UK = 'UK government cereal aphid guide';
const UK_EAR = 'Chambers et al. 1986, Ann. Appl. Biol. 108:219, via the UK government guide';
/** Cereal aphid thresholds, the same for wheat and barley. */
export const CEREAL_THRESHOLDS = ['wheat', 'barley'].flatMap((cropCode) => [
	rule({
		cropCode,
		pestCode: 'grain-aphid',
		bbchFrom: 10,
		bbchTo: 59,
		sampleUnit: 'tiller',
		metric: 'proportion',
		action: 0.5,
		requiresRising: true,
		label: 'more than 50 % of tillers infested and rising, before flowering',
		source: UK
	}),
	rule({
		cropCode,
		pestCode: 'grain-aphid',
		bbchFrom: 61,
		bbchTo: 69,
		sampleUnit: 'ear',
		metric: 'mean',
		action: 5,
		label: '5 aphids per ear at flowering',
		source: UK_EAR
	}),
	rule({
		cropCode,
		pestCode: 'grain-aphid',
		bbchFrom: 60,
		bbchTo: 71,
		sampleUnit: 'tiller',
		metric: 'proportion',
		action: 0.66,
		requiresRising: true,
		label: '66 % of tillers infested, flowering to watery ripe',
		source: UK
	}),
	rule({
		cropCode,
		pestCode: 'bird-cherry-oat-aphid',
		bbchFrom: 41,
		bbchTo: 59,
		sampleUnit: 'tiller',
		metric: 'mean',
		action: 20,
		label:
			'20 per tiller with few natural enemies, boot to heading (up to 50 where enemies are many)',
		source: 'Kansas State extension'
	}),
	rule({
		cropCode,
		pestCode: 'greenbug',
		...ANY,
		sampleUnit: 'tiller',
		metric: 'mean',
		action: 12.5,
		label: '12.5 per tiller (generic binomial plan for US small grains)',
		source: 'binomial sequential sampling papers for US small grains'
	})
]);
