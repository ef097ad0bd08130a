import type { PathOptions } from 'leaflet';
import type { LevelKey } from '$lib/engine';

/** The level colours of tailwind.config.ts (level.*), for SVG where classes cannot reach. */
export const LEVEL_HEX: Record<LevelKey, string> = {
	calm: '#4a9a6e',
	stirring: '#e2b43c',
	action: '#d7711f',
	severe: '#8e2a5c'
};

/** Outline dash per level, so shapes differ in stroke as well as in fill and hatching. */
const DASH: Record<LevelKey, string | undefined> = {
	calm: undefined,
	stirring: '6 4',
	action: '2 3',
	severe: undefined
};

export const patternId = (level: LevelKey | null) => `cornicle-fill-${level ?? 'none'}`;

/** Leaflet path style of a block or cell: hatch pattern fill, level stroke and dash, class. */
export function levelStyle(level: LevelKey | null, extra = ''): PathOptions {
	return {
		color: level ? LEVEL_HEX[level] : '#755f4b',
		weight: level === 'severe' ? 3 : 2,
		dashArray: level ? DASH[level] : '1 4',
		fillColor: `url(#${patternId(level)})`,
		fillOpacity: 0.85,
		className: `level-shape level-${level ?? 'none'} ${extra}`.trim()
	};
}
