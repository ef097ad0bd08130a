import { booleanPointInPolygon, point, polygon } from '@turf/turf';
import type { GeoJSONPolygon } from '$lib/geo/types';

/** True when a position lies outside a block's boundary (false when there is no boundary). */
export function outsideBoundary(boundary: GeoJSONPolygon | null, lat: number, lon: number) {
	if (!boundary) return false;
	return !booleanPointInPolygon(point([lon, lat]), polygon(boundary.coordinates));
}
