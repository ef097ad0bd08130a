import type * as Leaflet from 'leaflet';
import { graticule } from './context';

export type L = typeof Leaflet;

export interface BaseMapOptions {
	/** A deployment's tile URL template (MAP_TILE_URL), or null for the offline context layer only. */
	tileUrl: string | null;
	tileAttribution?: string | null;
	center?: [number, number];
	zoom?: number;
}

/**
 * A Leaflet map that is useful with no network: a scale bar and a labelled latitude/longitude
 * grid drawn in code, plus the deployment's tiles when configured.
 */
export function createBaseMap(L: L, el: HTMLElement, opts: BaseMapOptions) {
	const map = L.map(el, {
		center: opts.center ?? [47.22, -96.9],
		zoom: opts.zoom ?? 12,
		preferCanvas: false,
		zoomSnap: 0.5
	});
	L.control.scale({ imperial: true, metric: true, position: 'bottomleft' }).addTo(map);
	if (opts.tileUrl) {
		L.tileLayer(opts.tileUrl, { attribution: opts.tileAttribution ?? '', maxZoom: 19 }).addTo(map);
	}
	const grid = L.layerGroup().addTo(map);
	const drawGrid = () => {
		grid.clearLayers();
		const b = map.getBounds();
		const lines = graticule(
			{ south: b.getSouth(), west: b.getWest(), north: b.getNorth(), east: b.getEast() },
			map.getZoom()
		);
		for (const line of lines) {
			L.polyline(line.points, {
				color: '#9a8365',
				weight: 1,
				opacity: 0.5,
				interactive: false,
				className: 'graticule'
			}).addTo(grid);
			const at: [number, number] =
				line.kind === 'lat' ? [line.points[0][0], b.getWest()] : [b.getSouth(), line.points[0][1]];
			L.marker(at, {
				interactive: false,
				keyboard: false,
				icon: L.divIcon({
					className: `graticule-label graticule-${line.kind}`,
					html: line.label,
					iconSize: [70, 14],
					iconAnchor: line.kind === 'lat' ? [-2, 14] : [-2, 16]
				})
			}).addTo(grid);
		}
	};
	map.on('moveend', drawGrid);
	map.whenReady(drawGrid);
	return map;
}
