import type { LevelKey } from '$lib/engine';

/** Display names and glyphs of Cornicle's four levels (glyphs keep meaning without colour). */
export const LEVEL_DISPLAY: Record<LevelKey, { label: string; glyph: string; hint: string }> = {
	calm: { label: 'Calm', glyph: '○', hint: 'Below threshold and not expected to reach it soon' },
	stirring: {
		label: 'Stirring',
		glyph: '◔',
		hint: 'Rising; may reach the action threshold before the next visit'
	},
	action: { label: 'Action due', glyph: '◑', hint: 'At or above the action threshold' },
	severe: { label: 'Severe', glyph: '●', hint: 'At or near the economic injury level' }
};

export const LEVEL_ORDER: LevelKey[] = ['severe', 'action', 'stirring', 'calm'];
