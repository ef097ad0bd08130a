import type { EnemyRules } from './types';
import type { SampleSummary } from './sample';

const GUIDE = 'UK government cereal aphid guide; Giles et al. 2003';

/** Mummy shares that change the advice, from cereal work (UK government guide; Giles et al. 2003). */
export const DEFAULT_ENEMY_RULES: EnemyRules = {
	selectiveBelow: {
		value: 0.02,
		source: `${GUIDE}: < 2 % mummified at threshold, treat with a selective product`,
		provenance: 'published'
	},
	doNotTreatAbove: {
		value: 0.05,
		source: `${GUIDE}: > 5 % mummified, do not treat`,
		provenance: 'published'
	},
	populationsHeldAt: {
		value: 0.2,
		source: `${GUIDE}: >= 20 % parasitized, populations do not rise`,
		provenance: 'published'
	}
};

export type EnemyAdvice =
	'selective-product' | 'treat' | 'do-not-treat' | 'populations-held' | 'unknown';

export interface EnemyReading {
	mummies: number;
	/** mummies / (mummies + live aphids) on the same units; null when nothing was seen. */
	mummyShare: number | null;
	predators: number;
	predatorsPerUnit: number;
	/** Live aphids per predator; null with no predators. */
	aphidsPerPredator: number | null;
	advice: EnemyAdvice;
	/** True when parasitism is high enough to hold back treatment. */
	holdsAction: boolean;
	/** True when populations are expected not to rise. */
	holdsGrowth: boolean;
	note: string;
}

/** Reads mummies and predators from a visit; predators are reported, not yet scored. */
export function readEnemies(
	s: SampleSummary | null,
	rules: EnemyRules = DEFAULT_ENEMY_RULES
): EnemyReading {
	const live = s?.total ?? 0;
	const mummies = s?.mummies ?? 0;
	const predators = s?.predators ?? 0;
	const seen = live + mummies;
	const share = seen > 0 && s?.total !== null ? mummies / seen : null;
	let advice: EnemyAdvice = 'unknown';
	let note = 'no parasitism reading';
	if (share !== null) {
		const pct = `${(share * 100).toFixed(share < 0.1 ? 1 : 0)} % mummified`;
		if (share >= rules.populationsHeldAt.value) {
			advice = 'populations-held';
			note = `${pct}: populations are not expected to rise`;
		} else if (share > rules.doNotTreatAbove.value) {
			advice = 'do-not-treat';
			note = `${pct}: parasitoids are likely to hold it`;
		} else if (share < rules.selectiveBelow.value) {
			advice = 'selective-product';
			note = `${pct}: if treating, use a selective product`;
		} else {
			advice = 'treat';
			note = pct;
		}
	}
	return {
		mummies,
		mummyShare: share,
		predators,
		predatorsPerUnit: s && s.n > 0 ? predators / s.n : 0,
		aphidsPerPredator: predators > 0 ? live / predators : null,
		advice,
		holdsAction: advice === 'do-not-treat' || advice === 'populations-held',
		holdsGrowth: advice === 'populations-held',
		note
	};
}
