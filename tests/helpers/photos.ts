import { mkdirSync, writeFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { join } from 'node:path';
import sharp from 'sharp';
import { QueryTypes } from 'sequelize';
import { Photo } from '../../src/lib/server/db/models';
import { testDb } from './db';

/** A small real PNG (a yellow card with a dark dot), as a phone camera would not make it. */
export async function pngBytes(width = 64, height = 48, seed = 0): Promise<Buffer> {
	const dot = Buffer.from(
		`<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}"><rect width="100%" height="100%" fill="#f5d90a"/><circle cx="${10 + (seed % 40)}" cy="20" r="6" fill="#222"/></svg>`
	);
	return sharp(dot).png().toBuffer();
}

/** A photo on the demo block North Forty, filed by its scout, with real files in PHOTO_DIR. */
export async function ensureDemoPhoto(): Promise<number> {
	const [row] = await testDb().query<{
		id: number | null;
		blockId: number;
		orgId: number;
		scoutId: number;
	}>(
		`SELECT (SELECT MIN(p.id) FROM photos p WHERE p.block_id = b.id AND p.caption = 'route-walk photo') AS id,
		        b.id AS blockId, b.organisation_id AS orgId,
		        (SELECT a.scout_id FROM scouting_assignments a WHERE a.block_id = b.id LIMIT 1) AS scoutId
		   FROM blocks b WHERE b.name = 'North Forty'`,
		{ type: QueryTypes.SELECT }
	);
	if (row.id) return row.id;
	const dir = process.env.PHOTO_DIR;
	if (!dir) throw new Error('PHOTO_DIR is not set: run the tests through `npm test`');
	const bytes = await pngBytes();
	const thumb = await sharp(bytes).jpeg().toBuffer();
	const name = `ff${createHash('sha1').update(String(Date.now())).digest('hex').slice(0, 20)}`;
	mkdirSync(join(dir, 'ff'), { recursive: true });
	writeFileSync(join(dir, 'ff', `${name}.png`), bytes);
	writeFileSync(join(dir, 'ff', `${name}-thumb.jpg`), thumb);
	const p = await Photo.create({
		organisationId: row.orgId,
		blockId: row.blockId,
		uploadedBy: row.scoutId,
		storageKey: `ff/${name}.png`,
		thumbKey: `ff/${name}-thumb.jpg`,
		mime: 'image/png',
		bytes: bytes.length,
		width: 64,
		height: 48,
		sha256: createHash('sha256').update(bytes).digest('hex'),
		caption: 'route-walk photo'
	});
	return p.id;
}
