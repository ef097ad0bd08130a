import type { BlockFeatureProps } from '$lib/map/geojson';

/** A block on the map: the feature's properties with its id. */
export type MapBlock = BlockFeatureProps & { id: number };

export interface TrapProps {
	id: number;
	name: string;
	kind: string;
	farm: string;
	latest: {
		readOn: string;
		daysOut: number;
		alateTotal: number;
		alateCounts: Record<string, number>;
	} | null;
}
