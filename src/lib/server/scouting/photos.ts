import { createHash, randomUUID } from 'node:crypto';
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import { db, Photo, Trap, TrapReading } from '../db';
import { blockFor, trapFor, type Refusal } from './access';
import { photoStore } from './storage';

/** 8 MB: a full-resolution phone photo fits, a video does not (common practice). */
export const PHOTO_MAX_BYTES = 8 * 1024 * 1024;
const TYPES: Record<string, 'jpg' | 'png' | 'webp'> = {
	'image/jpeg': 'jpg',
	'image/png': 'png',
	'image/webp': 'webp'
};
const THUMB_PX = 320;

export type PhotoResult =
	| {
			ok: true;
			created: boolean;
			photo: {
				id: number;
				url: string;
				thumbUrl: string;
				width: number;
				height: number;
				bytes: number;
				mime: string;
			};
	  }
	| ({ ok: false; path?: string } & (Refusal | { status: 400 | 413; message: string }));

const out = (p: Photo) => ({
	id: p.id,
	url: `/api/photos/${p.id}`,
	thumbUrl: `/api/photos/${p.id}?size=thumb`,
	width: p.width,
	height: p.height,
	bytes: p.bytes,
	mime: p.mime
});

/**
 * Stores a photo of a block (for a visit) or of a trap card: size cap, type from the content,
 * a thumbnail, bytes in the photo store and metadata in the database. The same picture sent
 * again by the same person for the same block or trap returns the first copy.
 */
export async function savePhoto(
	user: SessionUser,
	target: { blockId?: number; trapId?: number },
	bytes: Buffer,
	caption: string | null
): Promise<PhotoResult> {
	if (bytes.length > PHOTO_MAX_BYTES)
		return {
			ok: false,
			status: 413,
			path: 'file',
			message: `file: the photo is larger than ${PHOTO_MAX_BYTES / 1024 / 1024} MB`
		};
	if (bytes.length === 0)
		return { ok: false, status: 400, path: 'file', message: 'file: no photo was sent' };
	let blockId: number | null = null;
	let organisationId = user.organisationId;
	if (target.blockId) {
		const a = await blockFor(user, target.blockId, 'write');
		if (!a.ok) return a;
		blockId = a.value.id;
		organisationId = a.value.organisationId;
	} else if (target.trapId) {
		const a = await trapFor(user, target.trapId);
		if (!a.ok) return a;
	} else
		return { ok: false, status: 400, path: 'blockId', message: 'blockId or trapId is required' };

	const type = await fileTypeFromBuffer(bytes);
	const ext = type ? TYPES[type.mime] : undefined;
	if (!type || !ext)
		return {
			ok: false,
			status: 400,
			path: 'file',
			message: `file: not a JPEG, PNG or WebP image (the content looks like ${type?.mime ?? 'no known image type'})`
		};
	let meta: sharp.Metadata;
	let thumb: Buffer;
	try {
		const img = sharp(bytes, { failOn: 'error' }).rotate();
		meta = await img.metadata();
		thumb = await img
			.resize(THUMB_PX, THUMB_PX, { fit: 'inside' })
			.jpeg({ quality: 70 })
			.toBuffer();
	} catch {
		return {
			ok: false,
			status: 400,
			path: 'file',
			message: 'file: the image is damaged and cannot be read'
		};
	}
	const sha256 = createHash('sha256').update(bytes).digest('hex');
	const same = await Photo.findOne({
		where: { uploadedBy: user.id, sha256, blockId, visitId: null, trapReadingId: null }
	});
	if (same) return { ok: true, created: false, photo: out(same) };

	const name = randomUUID();
	const key = `${name.slice(0, 2)}/${name}.${ext}`;
	const thumbKey = `${name.slice(0, 2)}/${name}-thumb.jpg`;
	const store = photoStore();
	await store.put(key, bytes);
	await store.put(thumbKey, thumb);
	try {
		const photo = await db().transaction((transaction) =>
			Photo.create(
				{
					organisationId,
					blockId,
					uploadedBy: user.id,
					storageKey: key,
					thumbKey,
					mime: type.mime,
					bytes: bytes.length,
					width: meta.autoOrient?.width ?? meta.width ?? 0,
					height: meta.autoOrient?.height ?? meta.height ?? 0,
					sha256,
					caption
				},
				{ transaction }
			)
		);
		return { ok: true, created: true, photo: out(photo) };
	} catch (e) {
		await store.remove(key);
		await store.remove(thumbKey);
		throw e;
	}
}

/** The bytes of a photo (or its thumbnail) if the user may see its block or trap. */
export async function readPhoto(user: SessionUser, id: number, thumb: boolean) {
	const p = await Photo.findByPk(id);
	if (!p || p.organisationId !== user.organisationId) return null;
	if (p.blockId) {
		if (!(await blockFor(user, p.blockId, 'read')).ok) return null;
	} else if (p.trapReadingId) {
		const r = await TrapReading.findByPk(p.trapReadingId, {
			include: [{ model: Trap, as: 'trap' }]
		});
		if (!r || !(await trapFor(user, r.trapId)).ok) return null;
	} else if (p.uploadedBy !== user.id) return null;
	const bytes = await photoStore().get(thumb ? p.thumbKey : p.storageKey);
	if (!bytes) return null;
	return { bytes, mime: thumb ? 'image/jpeg' : p.mime };
}
