/** Grid spacing in degrees that gives a handful of lines across the view at a zoom level. */
export function graticuleStep(zoom: number): number {
	if (zoom >= 15) return 0.005;
	if (zoom >= 13) return 0.01;
	if (zoom >= 11) return 0.05;
	if (zoom >= 9) return 0.1;
	if (zoom >= 7) return 0.5;
	return 1;
}

export interface GraticuleLine {
	/** [lat, lon] pairs, as Leaflet takes them. */
	points: [number, number][];
	label: string;
	kind: 'lat' | 'lon';
}

const label = (v: number, pos: string, neg: string, step: number) => {
	const digits = step < 0.01 ? 3 : step < 0.1 ? 2 : step < 1 ? 1 : 0;
	return `${Math.abs(v).toFixed(digits)}° ${v >= 0 ? pos : neg}`;
};

/**
 * Latitude and longitude lines covering a view, so the map keeps a sense of place and scale
 * with no tile server. Generated in code: nothing to download.
 */
export function graticule(
	b: { south: number; west: number; north: number; east: number },
	zoom: number
): GraticuleLine[] {
	const step = graticuleStep(zoom);
	const lines: GraticuleLine[] = [];
	const s = Math.max(-85, b.south);
	const n = Math.min(85, b.north);
	for (let lat = Math.ceil(s / step) * step; lat <= n && lines.length < 200; lat += step) {
		lines.push({
			kind: 'lat',
			points: [
				[lat, b.west],
				[lat, b.east]
			],
			label: label(lat, 'N', 'S', step)
		});
	}
	for (
		let lon = Math.ceil(b.west / step) * step;
		lon <= b.east && lines.length < 400;
		lon += step
	) {
		lines.push({
			kind: 'lon',
			points: [
				[s, lon],
				[n, lon]
			],
			label: label(lon, 'E', 'W', step)
		});
	}
	return lines;
}
