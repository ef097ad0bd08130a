import { area, bbox, centroid, polygon } from '@turf/turf';
import type { GeoJSONPolygon } from './types';

export const HA_PER_M2 = 1e-4;
/** 1 acre = 4046.8564224 m2 (international acre, exact by definition). */
export const M2_PER_ACRE = 4046.8564224;

export interface Measured {
	areaHa: number;
	areaAc: number;
	centroidLat: number;
	centroidLon: number;
	minLat: number;
	minLon: number;
	maxLat: number;
	maxLon: number;
}

/** Geodesic area, centroid and bounding box of a polygon, as stored on a block. */
export function measurePolygon(geom: GeoJSONPolygon): Measured {
	const feature = polygon(geom.coordinates);
	const m2 = area(feature);
	const [minLon, minLat, maxLon, maxLat] = bbox(feature);
	const [cLon, cLat] = centroid(feature).geometry.coordinates;
	return {
		areaHa: m2 * HA_PER_M2,
		areaAc: m2 / M2_PER_ACRE,
		centroidLat: cLat,
		centroidLon: cLon,
		minLat,
		minLon,
		maxLat,
		maxLon
	};
}
