import type { LevelKey } from './types';

/** Cornicle's four pressure levels, lowest first. */
export const LEVELS: readonly {
	key: LevelKey;
	label: string;
	rank: 0 | 1 | 2 | 3;
	description: string;
}[] = [
	{
		key: 'calm',
		label: 'Calm',
		rank: 0,
		description: 'Below the action threshold and not forecast to reach it before the next visit.'
	},
	{
		key: 'stirring',
		label: 'Stirring',
		rank: 1,
		description:
			'Below the action threshold but rising towards it before the next visit, or held back by natural enemies.'
	},
	{
		key: 'action',
		label: 'Action due',
		rank: 2,
		description: 'At or above the action threshold for this crop and growth stage.'
	},
	{
		key: 'severe',
		label: 'Severe',
		rank: 3,
		description:
			'At or above the economic injury level, or forecast to reach it before the next visit.'
	}
];

/** Rank of a level key, 0 (calm) to 3 (severe). */
export function levelRank(key: LevelKey): number {
	return LEVELS.findIndex((l) => l.key === key);
}
