import { QueryTypes } from 'sequelize';
import { Block, db, Membership, ScoutingAssignment, User } from '../db';

export interface AssignmentRow {
	id: number;
	blockId: number;
	blockName: string;
	farmName: string;
	scoutId: number;
	scoutName: string;
	intervalDays: number;
	lastVisitOn: string | null;
}

/** Active assignments of an organisation, by farm and block (one query). */
export function assignmentsOf(organisationId: number) {
	return db().query<AssignmentRow>(
		`SELECT a.id, b.id AS blockId, b.name AS blockName, f.name AS farmName, u.id AS scoutId,
		        u.name AS scoutName, a.interval_days AS intervalDays, b.last_visit_on AS lastVisitOn
		   FROM scouting_assignments a
		   JOIN blocks b ON b.id = a.block_id
		   JOIN farms f ON f.id = b.farm_id
		   JOIN users u ON u.id = a.scout_id
		  WHERE b.organisation_id = ? AND a.active = 1
		  ORDER BY f.name, b.name, u.name`,
		{ replacements: [organisationId], type: QueryTypes.SELECT }
	);
}

export async function scoutsOf(organisationId: number) {
	const rows = await Membership.findAll({
		where: { organisationId, role: 'scout' },
		include: [{ model: User, as: 'user', attributes: ['id', 'name'] }]
	});
	return rows
		.map((m) => (m as Membership & { user: User }).user)
		.map((u) => ({ id: u.id, name: u.name }))
		.sort((a, b) => a.name.localeCompare(b.name));
}

/** Assigns a block to a scout (or changes the interval); both must be of the organisation. */
export async function assign(
	user: SessionUser,
	input: { blockId: number; scoutId: number; intervalDays: number }
): Promise<{ ok: true } | { ok: false; field: 'blockId' | 'scoutId'; message: string }> {
	const [block, scout] = await Promise.all([
		Block.findOne({ where: { id: input.blockId, organisationId: user.organisationId } }),
		Membership.findOne({
			where: { userId: input.scoutId, organisationId: user.organisationId, role: 'scout' }
		})
	]);
	if (!block) return { ok: false, field: 'blockId', message: 'No such block in your organisation' };
	if (!scout) return { ok: false, field: 'scoutId', message: 'No such scout in your organisation' };
	await db().transaction(async (transaction) => {
		const existing = await ScoutingAssignment.findOne({
			where: { blockId: block.id, scoutId: input.scoutId },
			transaction
		});
		if (existing)
			await existing.update(
				{ active: true, intervalDays: input.intervalDays, assignedBy: user.id },
				{ transaction }
			);
		else
			await ScoutingAssignment.create(
				{
					blockId: block.id,
					scoutId: input.scoutId,
					intervalDays: input.intervalDays,
					assignedBy: user.id
				},
				{ transaction }
			);
	});
	return { ok: true };
}

/** Ends an assignment of the organisation; false when there is none. */
export async function unassign(user: SessionUser, id: number) {
	const a = await ScoutingAssignment.findByPk(id, { include: [{ model: Block, as: 'block' }] });
	if (
		!a ||
		(a as ScoutingAssignment & { block: Block }).block.organisationId !== user.organisationId
	)
		return false;
	await db().transaction((transaction) => a.update({ active: false }, { transaction }));
	return true;
}
