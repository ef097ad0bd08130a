import type { LevelKey } from '$lib/engine';

export interface BlockFeatureProps {
	id: number;
	name: string;
	farm: string;
	crop: string;
	cropName: string;
	pest: string;
	pestName: string;
	areaHa: number;
	level: LevelKey | null;
	reason: string | null;
	lastVisitOn: string | null;
	/** False when the block has no drawn boundary yet (the geometry is then its centre point). */
	drawn: boolean;
}

export interface BlockRowLike extends Omit<BlockFeatureProps, 'drawn'> {
	centroidLat: number;
	centroidLon: number;
	boundary: string | null;
}

/**
 * A FeatureCollection text for the map. The stored boundary text is spliced in as it is (it was
 * checked when saved), which keeps 5,000 blocks well inside the map's time budget.
 */
export function blocksFeatureCollection(rows: BlockRowLike[]): string {
	const parts = rows.map((r) => {
		const drawn = !!r.boundary && r.boundary !== 'null';
		const geometry = drawn
			? r.boundary
			: `{"type":"Point","coordinates":[${Number(r.centroidLon)},${Number(r.centroidLat)}]}`;
		const props: BlockFeatureProps = {
			id: r.id,
			name: r.name,
			farm: r.farm,
			crop: r.crop,
			cropName: r.cropName,
			pest: r.pest,
			pestName: r.pestName,
			areaHa: Number(r.areaHa),
			level: r.level,
			reason: r.reason,
			lastVisitOn: r.lastVisitOn ? String(r.lastVisitOn).slice(0, 10) : null,
			drawn
		};
		return `{"type":"Feature","id":${r.id},"geometry":${geometry},"properties":${JSON.stringify(props)}}`;
	});
	return `{"type":"FeatureCollection","features":[${parts.join(',')}]}`;
}
