import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { call } from '../helpers/app';
import { closeTestDb, testDb } from '../helpers/db';
import { pngBytes } from '../helpers/photos';

let blockId = 0;
const photoCount = async () =>
	(
		await testDb().query<{ n: number }>('SELECT COUNT(*) AS n FROM photos', {
			type: QueryTypes.SELECT
		})
	)[0].n;

beforeAll(async () => {
	const [b] = await testDb().query<{ id: number }>(
		`SELECT id FROM blocks WHERE name = 'North Forty'`,
		{
			type: QueryTypes.SELECT
		}
	);
	blockId = b.id;
});
afterAll(closeTestDb);

function upload(
	bytes: Buffer | Uint8Array,
	name: string,
	type: string,
	as: 'scout' | 'grower' = 'scout'
) {
	const form = new FormData();
	form.set('file', new Blob([new Uint8Array(bytes)], { type }), name);
	form.set('blockId', String(blockId));
	return call('/api/photos', { as, method: 'POST', body: form });
}

describe('photos', () => {
	it('stores a real image with a thumbnail, once, and serves it only to who may see the block', async () => {
		const png = await pngBytes(200, 120, 7);
		const res = await upload(png, 'card.png', 'image/png');
		expect(res.status).toBe(201);
		const { photo } = await res.json();
		expect(photo).toMatchObject({ width: 200, height: 120, mime: 'image/png', bytes: png.length });
		const again = await upload(png, 'same-card.png', 'image/png');
		expect(again.status).toBe(200);
		expect((await again.json()).photo.id).toBe(photo.id);

		const full = await call(photo.url, { as: 'agronomist' });
		expect(full.status).toBe(200);
		expect(full.headers.get('content-type')).toBe('image/png');
		expect(Buffer.from(await full.arrayBuffer()).equals(png)).toBe(true);
		const thumb = await call(photo.thumbUrl, { as: 'grower' });
		expect(thumb.status).toBe(200);
		expect(thumb.headers.get('content-type')).toBe('image/jpeg');
		for (const who of ['coopAgronomist', 'grower2'] as const)
			expect((await call(photo.url, { as: who })).status, who).toBe(404);
		expect((await call(photo.url, { as: null })).status).toBe(401);
	});

	it('links an uploaded photo to a visit', async () => {
		const { photo } = await (
			await upload(await pngBytes(80, 60, 21), 'leaf.png', 'image/png')
		).json();
		const res = await call('/api/visits', {
			as: 'scout',
			json: {
				blockId,
				visitedOn: new Date().toISOString().slice(0, 10),
				sampleUnit: 'plant',
				mode: 'count',
				counts: [{ stop: 1, unit: 1, aphids: 3 }],
				photoIds: [photo.id]
			}
		});
		expect(res.status).toBe(201);
		expect((await res.json()).visit.photos.map((p: { id: number }) => p.id)).toEqual([photo.id]);
	});

	it('refuses a photo over 8 MB and stores nothing', async () => {
		const before = await photoCount();
		const big = Buffer.alloc(8 * 1024 * 1024 + 1);
		(await pngBytes()).copy(big);
		const res = await upload(big, 'huge.png', 'image/png');
		expect(res.status).toBe(413);
		expect((await res.json()).message).toMatch(/larger than 8 MB/);
		expect(await photoCount()).toBe(before);
	});

	it('refuses a file that claims to be an image but is not', async () => {
		const before = await photoCount();
		const res = await upload(Buffer.from('<html>not a picture</html>'), 'leaf.jpg', 'image/jpeg');
		expect(res.status).toBe(400);
		const out = await res.json();
		expect(out.issues[0].path).toBe('file');
		expect(out.message).toMatch(/not a JPEG, PNG or WebP/);
		const pdf = await upload(
			Buffer.from('%PDF-1.4\n%âãÏÓ\n1 0 obj\n<<>>\nendobj\n'),
			'x.png',
			'image/png'
		);
		expect(pdf.status).toBe(400);
		expect(await photoCount()).toBe(before);
	});

	it('refuses growers and blocks of other organisations', async () => {
		expect((await upload(await pngBytes(), 'a.png', 'image/png', 'grower')).status).toBe(403);
		const [other] = await testDb().query<{ id: number }>(
			`SELECT id FROM blocks WHERE name = 'Brask Soy West'`,
			{
				type: QueryTypes.SELECT
			}
		);
		const form = new FormData();
		form.set('file', new Blob([new Uint8Array(await pngBytes())], { type: 'image/png' }), 'a.png');
		form.set('blockId', String(other.id));
		expect((await call('/api/photos', { as: 'scout', method: 'POST', body: form })).status).toBe(
			404
		);
	});
});
