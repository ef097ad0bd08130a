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

/** What decides whether a user may read or file visits on a block. */
export interface BlockFacts {
	organisationId: number;
	growerId: number | null;
	/** Whether the user (a scout) has an active assignment on the block. */
	assigned: () => Promise<boolean> | boolean;
}

/** The access rule for a block, shared by blockFor and the lean check of the visit write path. */
export async function blockAccess(
	user: SessionUser,
	facts: BlockFacts | null,
	mode: 'read' | 'write'
): Promise<{ ok: true } | ({ ok: false } & Refusal)> {
	if (!facts || facts.organisationId !== user.organisationId)
		return { ok: false, ...notFound('block') };
	if (user.role === 'admin' || user.role === 'agronomist') return { ok: true };
	if (user.role === 'scout') {
		if (await facts.assigned()) return { ok: true };
		return {
			ok: false,
			status: 403,
			message: 'You are not assigned to this block; ask an agronomist to assign it.'
		};
	}
	if (user.role === 'grower' && mode === 'read' && facts.growerId === user.id) return { ok: true };
	if (user.role === 'grower' && facts.growerId !== user.id)
		return { ok: false, ...notFound('block') };
	return { ok: false, status: 403, message: `A ${user.role} cannot file visits.` };
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
	const facts = block && {
		organisationId: block.organisationId,
		growerId: block.farm.growerId,
		assigned: () => assigned(user.id, block.id, transaction)
	};
	const r = await blockAccess(user, facts, mode);
	return r.ok ? { ok: true, value: block! } : r;
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
