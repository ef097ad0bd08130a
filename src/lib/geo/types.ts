/** A GeoJSON Polygon geometry (RFC 7946): rings of [longitude, latitude] positions. */
export interface GeoJSONPolygon {
	type: 'Polygon';
	coordinates: [number, number][][];
}
