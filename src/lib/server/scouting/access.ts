import type { Transaction } from 'sequelize';
import { Block, Farm, ScoutingAssignment, Trap } from '../db/models';

export type Refusal = { status: 403 | 404; message: string };
export type Access<T> = { ok: true; value: T } | ({ ok: false } & Refusal);

const notFound = (what: string): Refusal => ({ status: 404, message: `No such ${what}.` });

async function assigned(scoutId: number, blockId: number, transaction?: Transaction) {
	return !!(await ScoutingAssignment.findOne({
		where: { scoutId, blockId, active: true },
		attributes: ['id'],
		transaction
	}));
}

/**
 * A block the user may see (read) or file visits on (write). Another organisation's block, or
 * a grower's neighbour's, answers 404; a block of the scout's organisation they are not
 * assigned to answers 403 with the reason.
 */
export async function blockFor(
	user: SessionUser,
	blockId: number,
	mode: 'read' | 'write',
	transaction?: Transaction
): Promise<Access<Block & { farm: Farm }>> {
	const block = (await Block.findByPk(blockId, {
		include: [{ model: Farm, as: 'farm', attributes: ['id', 'growerId', 'name'] }],
		transaction
	})) as (Block & { farm: Farm }) | null;
	if (!block || block.organisationId !== user.organisationId)
		return { ok: false, ...notFound('block') };
	if (user.role === 'admin' || user.role === 'agronomist') return { ok: true, value: block };
	if (user.role === 'scout') {
		if (await assigned(user.id, block.id, transaction)) return { ok: true, value: block };
		return {
			ok: false,
			status: 403,
			message: 'You are not assigned to this block; ask an agronomist to assign it.'
		};
	}
	if (user.role === 'grower' && mode === 'read' && block.farm.growerId === user.id)
		return { ok: true, value: block };
	if (user.role === 'grower' && block.farm.growerId !== user.id)
		return { ok: false, ...notFound('block') };
	return { ok: false, status: 403, message: `A ${user.role} cannot file visits.` };
}

/** A trap the user may read: same organisation; scouts only on farms where they walk a block. */
export async function trapFor(
	user: SessionUser,
	trapId: number,
	transaction?: Transaction
): Promise<Access<Trap>> {
	const trap = await Trap.findByPk(trapId, { transaction });
	if (!trap || trap.organisationId !== user.organisationId)
		return { ok: false, ...notFound('trap') };
	if (user.role === 'admin' || user.role === 'agronomist') return { ok: true, value: trap };
	if (user.role === 'scout') {
		const n = await ScoutingAssignment.count({
			where: { scoutId: user.id, active: true },
			include: [{ model: Block, as: 'block', where: { farmId: trap.farmId }, attributes: [] }],
			transaction
		});
		if (n > 0) return { ok: true, value: trap };
		return { ok: false, status: 403, message: 'You walk no block on the farm of this trap.' };
	}
	return { ok: false, status: 403, message: `A ${user.role} cannot read traps.` };
}
