import { Op, QueryTypes, UniqueConstraintError } from 'sequelize';
import type { TrapReadingCreate } from '$lib/schemas/scouting';
import { db, Photo, TrapReading } from '../db';
import { trapFor, type Refusal } from './access';

export interface TrapReadingOut {
	id: number;
	clientKey: string | null;
	trapId: number;
	readOn: string;
	daysOut: number;
	alateCounts: Record<string, number>;
	alateTotal: number;
	perDay: number;
	cardChanged: boolean;
	notes: string | null;
}

const out = (r: TrapReading): TrapReadingOut => ({
	id: r.id,
	clientKey: r.clientKey ?? null,
	trapId: r.trapId,
	readOn: r.readOn,
	daysOut: r.daysOut,
	alateCounts: r.alateCounts,
	alateTotal: r.alateTotal,
	perDay: Math.round((r.alateTotal / r.daysOut) * 100) / 100,
	cardChanged: !!r.cardChanged,
	notes: r.notes ?? null
});

export type ReadingResult =
	| { ok: true; created: boolean; reading: TrapReadingOut }
	| ({ ok: false; path?: string } & (Refusal | { status: 400 | 409; message: string }));

async function replay(user: SessionUser, input: TrapReadingCreate): Promise<ReadingResult | null> {
	if (!input.clientKey) return null;
	const r = await TrapReading.findOne({ where: { clientKey: input.clientKey } });
	if (!r) return null;
	if (r.scoutId !== user.id || r.trapId !== input.trapId)
		return {
			ok: false,
			status: 409,
			message: 'This clientKey was already used for another reading.'
		};
	return { ok: true, created: false, reading: out(r) };
}

/** Stores one trap reading (idempotent by clientKey) and links its card photos. */
export async function createTrapReading(
	user: SessionUser,
	input: TrapReadingCreate
): Promise<ReadingResult> {
	const again = await replay(user, input);
	if (again) return again;
	const access = await trapFor(user, input.trapId);
	if (!access.ok) return access;
	const total = Object.values(input.alateCounts).reduce((a, b) => a + b, 0);
	try {
		const r = await db().transaction(async (transaction) => {
			const reading = await TrapReading.create(
				{
					trapId: input.trapId,
					scoutId: user.id,
					clientKey: input.clientKey ?? null,
					readOn: input.readOn,
					daysOut: input.daysOut,
					alateCounts: input.alateCounts,
					alateTotal: total,
					cardChanged: input.cardChanged,
					notes: input.notes?.trim() || null
				},
				{ transaction }
			);
			if (input.photoIds.length) {
				const [n] = await Photo.update(
					{ trapReadingId: reading.id },
					{
						where: {
							id: { [Op.in]: input.photoIds },
							uploadedBy: user.id,
							blockId: null,
							visitId: null,
							trapReadingId: null
						},
						transaction
					}
				);
				if (n !== new Set(input.photoIds).size) throw new PhotoLinkError();
			}
			return reading;
		});
		return { ok: true, created: true, reading: out(r) };
	} catch (e) {
		if (e instanceof UniqueConstraintError) {
			const again2 = await replay(user, input);
			if (again2) return again2;
		}
		if (e instanceof PhotoLinkError)
			return {
				ok: false,
				status: 400,
				path: 'photoIds',
				message: 'photoIds: a photo is unknown, not yours or already used'
			};
		throw e;
	}
}

class PhotoLinkError extends Error {}

export interface TrapRow {
	id: number;
	name: string;
	kind: string;
	farmId: number;
	farmName: string;
	lat: number;
	lon: number;
	active: boolean;
	lastReadOn: string | null;
	lastTotal: number | null;
	lastDaysOut: number | null;
}

/** Traps the user may read, with the latest reading (one query). */
export function trapsFor(user: SessionUser) {
	const scoutOnly =
		user.role === 'scout'
			? `AND t.farm_id IN (SELECT b.farm_id FROM blocks b JOIN scouting_assignments a ON a.block_id = b.id AND a.active = 1 WHERE a.scout_id = :uid)`
			: '';
	return db().query<TrapRow>(
		`SELECT t.id, t.name, t.kind, t.farm_id AS farmId, f.name AS farmName, t.lat, t.lon, t.active,
		        r.read_on AS lastReadOn, r.alate_total AS lastTotal, r.days_out AS lastDaysOut
		   FROM traps t
		   JOIN farms f ON f.id = t.farm_id
		   LEFT JOIN trap_readings r ON r.id = (
		        SELECT r2.id FROM trap_readings r2 WHERE r2.trap_id = t.id ORDER BY r2.read_on DESC, r2.id DESC LIMIT 1)
		  WHERE t.organisation_id = :org ${scoutOnly}
		  ORDER BY f.name, t.name`,
		{ replacements: { org: user.organisationId, uid: user.id }, type: QueryTypes.SELECT }
	);
}

/** A trap's readings, newest first. */
export async function readingsOf(trapId: number, limit = 20) {
	const rows = await TrapReading.findAll({
		where: { trapId },
		order: [
			['readOn', 'DESC'],
			['id', 'DESC']
		],
		limit
	});
	return rows.map(out);
}
