import { DOMParser } from '@xmldom/xmldom';
import { checkBoundary, type BoundaryCheck } from '$lib/geo/validate';
import { MAX_IMPORT_BYTES, parseBoundaryFile } from '$lib/geo/import';
import { AuditLog, Block, db } from './db';

const round = (n: number, d: number) => Math.round(n * 10 ** d) / 10 ** d;

/** Parses XML with @xmldom/xmldom, turning its fatal errors into a thrown error, quietly. */
function parseXml(text: string): Document {
	const parser = new DOMParser({
		onError: (level, msg) => {
			if (level === 'fatalError') throw new Error(msg);
		}
	});
	return parser.parseFromString(text, 'text/xml') as unknown as Document;
}

/** Reads an uploaded GeoJSON or KML file and checks the polygon in it. */
export async function checkBoundaryUpload(file: File): Promise<BoundaryCheck> {
	if (file.size > MAX_IMPORT_BYTES)
		return {
			ok: false,
			message: `The file is ${Math.round(file.size / 1000)} kB; the limit is ${MAX_IMPORT_BYTES / 1000} kB.`
		};
	const parsed = parseBoundaryFile(file.name, await file.text(), parseXml);
	return 'message' in parsed
		? { ok: false, message: parsed.message }
		: checkBoundary(parsed.geojson);
}

/** A block of the organisation (404 material when null), for boundary editing. */
export function blockForBoundary(blockId: number, organisationId: number) {
	return Block.findOne({
		where: { id: blockId, organisationId },
		attributes: [
			'id',
			'name',
			'organisationId',
			'farmId',
			'boundary',
			'areaHa',
			'currentLevel',
			'centroidLat',
			'centroidLon'
		]
	});
}

/**
 * Stores a checked boundary on a block with its area, centroid and bounding box, and an
 * audit entry, in one transaction. Returns false when the block is not the organisation's.
 */
export async function saveBoundary(
	blockId: number,
	organisationId: number,
	actorId: number,
	checked: Extract<BoundaryCheck, { ok: true }>
) {
	const m = checked.measured;
	return db().transaction(async (transaction) => {
		const [n] = await Block.update(
			{
				boundary: checked.polygon,
				areaHa: round(m.areaHa, 2),
				centroidLat: m.centroidLat,
				centroidLon: m.centroidLon,
				minLat: m.minLat,
				minLon: m.minLon,
				maxLat: m.maxLat,
				maxLon: m.maxLon
			},
			{ where: { id: blockId, organisationId }, transaction }
		);
		if (!n) return false;
		await AuditLog.create(
			{
				organisationId,
				actorId,
				action: 'boundary-saved',
				entity: 'block',
				entityId: String(blockId),
				details: { areaHa: round(m.areaHa, 2), corners: checked.polygon.coordinates[0].length - 1 }
			},
			{ transaction }
		);
		return true;
	});
}
