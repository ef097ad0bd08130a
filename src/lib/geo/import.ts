import { kml } from '@tmcw/togeojson';

/** Parses XML text into a Document (the browser's DOMParser, or @xmldom/xmldom on the server). */
export type XmlParser = (text: string) => Document;

export const MAX_IMPORT_BYTES = 2_000_000;

/**
 * Reads a GeoJSON or KML file's text into GeoJSON (not yet checked; see checkBoundary).
 * The kind is taken from the file name, or from the first character when the name says nothing.
 */
export function parseBoundaryFile(
	name: string,
	text: string,
	parseXml: XmlParser
): { geojson: unknown } | { message: string } {
	const lower = name.toLowerCase();
	const trimmed = text.trimStart();
	const isKml = lower.endsWith('.kml') || (!/\.(geo)?json$/.test(lower) && trimmed.startsWith('<'));
	if (!trimmed) return { message: `The file ${name || ''} is empty.`.replace('  ', ' ') };
	if (isKml) {
		let doc: Document;
		try {
			doc = parseXml(text);
		} catch {
			return { message: 'The KML file is not well-formed XML.' };
		}
		if (!doc?.documentElement || doc.getElementsByTagName('parsererror').length)
			return { message: 'The KML file is not well-formed XML.' };
		return { geojson: kml(doc) };
	}
	try {
		return { geojson: JSON.parse(text) };
	} catch (e) {
		return { message: `The GeoJSON file is not valid JSON (${(e as Error).message}).` };
	}
}
