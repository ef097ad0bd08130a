import { error } from '@sveltejs/kit';
import type { Transaction } from 'sequelize';
import { Block, Crop, Farm, Pest, Recommendation } from '../db/models';

export type BlockWithParts = Block & { farm: Farm; crop: Crop; pest: Pest };

/** Whether a user may see a farm's records: staff of its organisation, or its own grower. */
export function maySee(user: SessionUser, farm: Pick<Farm, 'organisationId' | 'growerId'>) {
	if (farm.organisationId !== user.organisationId) return false;
	if (user.role === 'agronomist' || user.role === 'admin') return true;
	return user.role === 'grower' && farm.growerId === user.id;
}

const parseId = (raw: string | number) => {
	const id = Number(raw);
	return Number.isInteger(id) && id > 0 ? id : null;
};

/**
 * A block the user may see, with its farm, crop and pest; anything else (another
 * organisation's, another grower's, a bad id) answers 404 so ids do not leak.
 */
export async function blockFor(
	user: SessionUser,
	rawId: string | number,
	transaction?: Transaction
): Promise<BlockWithParts> {
	const id = parseId(rawId);
	const block = id
		? ((await Block.findOne({
				where: { id, organisationId: user.organisationId },
				include: [
					{ model: Farm, as: 'farm' },
					{ model: Crop, as: 'crop' },
					{ model: Pest, as: 'pest' }
				],
				transaction
			})) as BlockWithParts | null)
		: null;
	if (!block || !maySee(user, block.farm)) error(404, 'No such block.');
	return block;
}

/** A recommendation the user may see (same rules as its block), locked for update if asked. */
export async function recommendationFor(
	user: SessionUser,
	rawId: string | number,
	transaction?: Transaction
) {
	const id = parseId(rawId);
	const rec = id
		? await Recommendation.findOne({
				where: { id, organisationId: user.organisationId },
				transaction,
				lock: transaction ? transaction.LOCK.UPDATE : undefined
			})
		: null;
	if (!rec) error(404, 'No such recommendation.');
	const block = await blockFor(user, rec.blockId, transaction).catch(() => null);
	if (!block) error(404, 'No such recommendation.');
	return { rec, block };
}
