import { describe, expect, it } from 'vitest';
import { DOMParser } from '@xmldom/xmldom';
import { checkBoundary } from './validate';
import { parseBoundaryFile } from './import';

// A 500 m x 400 m rectangle near the demo valley (47.2 N, 96.9 W).
const dLon = 0.5 / (111.32 * Math.cos((47.2 * Math.PI) / 180));
const dLat = 0.4 / 110.574;
const rect: [number, number][] = [
	[-96.9, 47.2],
	[-96.9 + dLon, 47.2],
	[-96.9 + dLon, 47.2 + dLat],
	[-96.9, 47.2 + dLat],
	[-96.9, 47.2]
];
const poly = (ring: unknown[]) => ({ type: 'Polygon', coordinates: [ring] });
const message = (input: unknown) => {
	const r = checkBoundary(input);
	return r.ok ? null : r.message;
};
const xml = (s: string) => new DOMParser().parseFromString(s, 'text/xml') as unknown as Document;

describe('checkBoundary', () => {
	it('accepts a closed rectangle and measures about 20 ha (500 m x 400 m, computed)', () => {
		const r = checkBoundary(poly(rect));
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		expect(r.measured.areaHa).toBeCloseTo(20, 0);
		// 1 ha = 2.4710538 ac (international acre, by definition)
		expect(r.measured.areaAc / r.measured.areaHa).toBeCloseTo(2.4710538, 5);
	});

	it('unwraps a Feature, a one-polygon FeatureCollection and a one-part MultiPolygon', () => {
		const f = { type: 'Feature', properties: {}, geometry: poly(rect) };
		expect(checkBoundary(f).ok).toBe(true);
		expect(checkBoundary({ type: 'FeatureCollection', features: [f] }).ok).toBe(true);
		expect(checkBoundary({ type: 'MultiPolygon', coordinates: [[rect]] }).ok).toBe(true);
	});

	it('names an open ring', () => {
		expect(message(poly(rect.slice(0, 4)))).toMatch(/outer ring is not closed/);
	});

	it('names a ring with too few positions', () => {
		expect(message(poly([rect[0], rect[1], rect[0]]))).toMatch(/needs at least 4/);
	});

	it('names a self-intersecting (bow-tie) boundary and where it crosses', () => {
		const bowtie = [rect[0], rect[2], rect[1], rect[3], rect[0]];
		expect(message(poly(bowtie))).toMatch(/crosses itself near 47\.\d+° N, 96\.\d+° W/);
	});

	it('refuses implausibly small and large blocks', () => {
		const tiny = rect.map(([x, y]) => [-96.9 + (x + 96.9) / 100, 47.2 + (y - 47.2) / 100]);
		expect(message(poly(tiny))).toMatch(/at least 0.05 ha/);
		const huge = rect.map(([x, y]) => [-96.9 + (x + 96.9) * 40, 47.2 + (y - 47.2) * 40]);
		expect(message(poly(huge))).toMatch(/under 2,000 ha/);
	});

	it('names out-of-range and non-numeric positions', () => {
		expect(message(poly([[200, 47], ...rect.slice(1)]))).toMatch(/longitude 200/);
		expect(message(poly([[-96.9, 'x'], ...rect.slice(1)]))).toMatch(/Position 1 .* not a/);
	});

	it('refuses points, lines, several polygons and non-GeoJSON', () => {
		expect(message({ type: 'Point', coordinates: [-96.9, 47.2] })).toMatch(/Point cannot/);
		const f = { type: 'Feature', properties: {}, geometry: poly(rect) };
		expect(message({ type: 'FeatureCollection', features: [f, f] })).toMatch(/2 polygons/);
		expect(message({ hello: 1 })).toMatch(/not GeoJSON/);
		expect(message(null)).toMatch(/not a GeoJSON object/);
	});
});

describe('parseBoundaryFile', () => {
	it('reads a KML placemark polygon (KML 2.2 coordinates are lon,lat[,alt])', () => {
		const coords = rect.map(([x, y]) => `${x},${y},0`).join(' ');
		const doc = `<?xml version="1.0"?><kml xmlns="http://www.opengis.net/kml/2.2"><Placemark><name>A</name>
			<Polygon><outerBoundaryIs><LinearRing><coordinates>${coords}</coordinates></LinearRing></outerBoundaryIs></Polygon>
			</Placemark></kml>`;
		const r = parseBoundaryFile('field.kml', doc, xml);
		expect('geojson' in r).toBe(true);
		if ('geojson' in r) expect(checkBoundary(r.geojson).ok).toBe(true);
	});

	it('names broken JSON and broken XML', () => {
		expect(parseBoundaryFile('a.geojson', '{"type":', xml)).toMatchObject({
			message: expect.stringMatching(/not valid JSON/)
		});
		expect(parseBoundaryFile('a.kml', '<kml><Placemark>', xml)).toMatchObject({
			message: expect.stringMatching(/not well-formed XML/)
		});
		expect(parseBoundaryFile('a.json', '  ', xml)).toMatchObject({ message: /empty/ });
	});
});

describe('ring orientation', () => {
	it('stores the outer ring counter-clockwise (RFC 7946 section 3.1.6)', () => {
		const clockwise = [...rect].reverse();
		const r = checkBoundary(poly(clockwise));
		expect(r.ok && r.polygon.coordinates[0]).toEqual(rect);
	});
});
