import { kinks, polygon, rewind } from '@turf/turf';
import { measurePolygon, type Measured } from './measure';
import type { GeoJSONPolygon } from './types';

/**
 * Plausible size of one block. Fields under a twentieth of a hectare or over 2,000 ha are
 * almost always a slip (a stray click, degrees swapped, a whole county): common practice.
 */
export const MIN_BLOCK_HA = 0.05;
export const MAX_BLOCK_HA = 2000;

export type BoundaryCheck =
	{ ok: true; polygon: GeoJSONPolygon; measured: Measured } | { ok: false; message: string };

const fail = (message: string): BoundaryCheck => ({ ok: false, message });
const fmt = (n: number) => n.toLocaleString('en-US', { maximumFractionDigits: 2 });
const where = ([lon, lat]: number[]) =>
	`${Math.abs(lat).toFixed(5)}° ${lat >= 0 ? 'N' : 'S'}, ${Math.abs(lon).toFixed(5)}° ${lon >= 0 ? 'E' : 'W'}`;

/** The one polygon inside a geometry, Feature or FeatureCollection, or a message why not. */
function onePolygon(input: unknown): { coords: unknown } | { message: string } {
	if (!input || typeof input !== 'object')
		return { message: 'The boundary is not a GeoJSON object.' };
	const g = input as {
		type?: unknown;
		coordinates?: unknown;
		geometry?: unknown;
		features?: unknown;
	};
	switch (g.type) {
		case 'Polygon':
			return { coords: g.coordinates };
		case 'MultiPolygon':
			if (Array.isArray(g.coordinates) && g.coordinates.length === 1)
				return { coords: g.coordinates[0] };
			return { message: 'The file holds several polygons; a block needs exactly one.' };
		case 'Feature':
			return g.geometry ? onePolygon(g.geometry) : { message: 'The feature has no geometry.' };
		case 'FeatureCollection': {
			const polys = (Array.isArray(g.features) ? g.features : []).filter((f) =>
				['Polygon', 'MultiPolygon'].includes(f?.geometry?.type)
			);
			if (polys.length === 1) return onePolygon(polys[0]);
			return {
				message: polys.length
					? `The file holds ${polys.length} polygons; a block needs exactly one.`
					: 'The file holds no polygon (points and lines cannot be a block boundary).'
			};
		}
		case 'Point':
		case 'LineString':
		case 'MultiPoint':
		case 'MultiLineString':
			return { message: `A ${g.type} cannot be a block boundary; draw or import a polygon.` };
		default:
			return { message: 'The boundary is not GeoJSON: no Polygon, Feature or FeatureCollection.' };
	}
}

function checkRing(ring: unknown, label: string): string | [number, number][] {
	if (!Array.isArray(ring)) return `The ${label} is not a list of positions.`;
	const pts: [number, number][] = [];
	for (const [i, p] of ring.entries()) {
		if (!Array.isArray(p) || p.length < 2 || !p.slice(0, 2).every(Number.isFinite))
			return `Position ${i + 1} of the ${label} is not a [longitude, latitude] pair of numbers.`;
		const [lon, lat] = p as number[];
		if (lon < -180 || lon > 180)
			return `Position ${i + 1} of the ${label} has longitude ${lon}, outside -180 to 180.`;
		if (lat < -90 || lat > 90)
			return `Position ${i + 1} of the ${label} has latitude ${lat}, outside -90 to 90.`;
		pts.push([lon, lat]);
	}
	if (pts.length < 4)
		return `The ${label} has ${pts.length} positions; a closed ring needs at least 4 (3 corners and the first again).`;
	const [a, z] = [pts[0], pts[pts.length - 1]];
	if (a[0] !== z[0] || a[1] !== z[1])
		return `The ${label} is not closed: it starts at ${where(a)} but ends at ${where(z)}.`;
	if (new Set(pts.slice(0, -1).map((p) => p.join(','))).size < 3)
		return `The ${label} has fewer than 3 distinct corners.`;
	return pts;
}

/**
 * Checks a drawn or imported boundary: one polygon, closed rings of valid positions, no
 * self-intersection and a plausible block size. Returns the clean polygon and its measures,
 * or a message naming the problem.
 */
export function checkBoundary(input: unknown): BoundaryCheck {
	const found = onePolygon(input);
	if ('message' in found) return fail(found.message);
	if (!Array.isArray(found.coords) || !found.coords.length)
		return fail('The polygon has no rings of positions.');
	const rings: [number, number][][] = [];
	for (const [i, ring] of found.coords.entries()) {
		const r = checkRing(ring, i === 0 ? 'outer ring' : `hole ${i}`);
		if (typeof r === 'string') return fail(r);
		rings.push(r);
	}
	const crossings = kinks(polygon(rings)).features;
	if (crossings.length)
		return fail(
			`The boundary crosses itself near ${where(crossings[0].geometry.coordinates)}; move the corners so the edges do not cross.`
		);
	// Outer ring counter-clockwise, holes clockwise (RFC 7946 section 3.1.6).
	const geom = (rewind(polygon(rings)) as unknown as { geometry: GeoJSONPolygon }).geometry;
	const measured = measurePolygon(geom);
	if (measured.areaHa < MIN_BLOCK_HA)
		return fail(
			`The boundary covers ${fmt(measured.areaHa * 10_000)} m²; a block should be at least ${MIN_BLOCK_HA} ha (${MIN_BLOCK_HA * 10_000} m²).`
		);
	if (measured.areaHa > MAX_BLOCK_HA)
		return fail(
			`The boundary covers ${fmt(measured.areaHa)} ha; a block should be under ${fmt(MAX_BLOCK_HA)} ha. Check it is one field and that positions are [longitude, latitude].`
		);
	return { ok: true, polygon: geom, measured };
}
