import type { LevelKey } from '$lib/engine';

/** Properties of a block on the map (GET /api/map/blocks); the feature id is the block id. */
export interface BlockFeatureProps {
	name: string;
	farm: string;
	/** Crop and pest codes (the page's filter lists give their names). */
	crop: string;
	pest: string;
	areaHa: number;
	level: LevelKey | null;
	lastVisitOn: string | null;
	/** False when the block has no drawn boundary yet (the geometry is then its centre point). */
	drawn: boolean;
}

/** One block in detail (GET /api/blocks/[id]/boundary): also the level's reason and names. */
export interface BlockDetailProps extends BlockFeatureProps {
	reason: string | null;
	cropName: string;
	pestName: string;
}
