import { Op, type Transaction } from 'sequelize';
import { isoPlusDays } from '$lib/engine';
import type { RecommendationWarning } from '$lib/domain';
import { Product, Recommendation, Visit, type Block } from '../db/models';

/**
 * BBCH principal growth stage 6 is flowering (codes 60-69) in the BBCH scale, an open standard
 * (Meier, ed., "Growth stages of mono- and dicotyledonous plants", BBCH monograph; from memory).
 */
export const BLOOM = { from: 60, to: 69 } as const;

export interface ProductFacts {
	name: string;
	iracGroup: string;
	reiHours: number;
	phiDays: number;
	beeHazard: 'low' | 'moderate' | 'high';
}

export interface PriorTreatment {
	id: number;
	productName: string;
	iracGroup: string;
	date: string;
	status: string;
}

export interface CheckContext {
	expectedHarvest: string | null;
	/** Growth stage at the latest visit with one recorded. */
	bbch: number | null;
	bbchOn: string | null;
	/** Treatments already issued or applied on the block this season. */
	prior: PriorTreatment[];
}

/** The label checks for a treat recommendation, as warnings: they inform, they do not block. */
export function treatmentWarnings(
	product: ProductFacts,
	targetDate: string,
	ctx: CheckContext
): RecommendationWarning[] {
	const out: RecommendationWarning[] = [];
	const harvestOk = isoPlusDays(targetDate, product.phiDays);
	if (!ctx.expectedHarvest) {
		out.push({
			code: 'other',
			message: `No expected harvest date is recorded for this block, so the PHI of ${product.phiDays} days could not be checked.`
		});
	} else if (harvestOk > ctx.expectedHarvest) {
		out.push({
			code: 'phi-past-harvest',
			message: `PHI runs past the expected harvest: ${product.name} has a PHI of ${product.phiDays} days, so a treatment on ${targetDate} allows harvest from ${harvestOk}, after the expected harvest on ${ctx.expectedHarvest}.`
		});
	}
	const same = ctx.prior.filter((p) => p.iracGroup === product.iracGroup);
	if (same.length) {
		const list = same.map((p) => `${p.productName} (${p.status} ${p.date})`).join(', ');
		out.push({
			code: 'irac-repeat',
			message: `IRAC group ${product.iracGroup} was already used on this block this season: ${list}. Rotate to another mode of action to slow resistance.`
		});
	}
	const b = ctx.bbch;
	if (b !== null && b >= BLOOM.from && b <= BLOOM.to) {
		out.push({
			code: 'bloom-pollinators',
			message: `The crop was in bloom at the last visit (BBCH ${b} on ${ctx.bbchOn}). ${product.name} has a ${product.beeHazard} bee hazard: do not spray open bloom while bees forage; spray late in the evening if the label allows, and tell beekeepers nearby.`
		});
	} else if (b !== null && b >= 50 && b < BLOOM.from) {
		out.push({
			code: 'bloom-pollinators',
			message: `Flower buds were showing at the last visit (BBCH ${b} on ${ctx.bbchOn}); bloom may open by ${targetDate}. Check before spraying (${product.beeHazard} bee hazard).`
		});
	} else if (b === null) {
		out.push({
			code: 'bloom-pollinators',
			message: `No growth stage is recorded, so bloom could not be checked. Look for open flowers before spraying (${product.beeHazard} bee hazard).`
		});
	}
	out.push({
		code: 'rei',
		message: `Re-entry interval ${product.reiHours} h: nobody enters the block after spraying until ${reiEnd(targetDate, product.reiHours)} at the earliest (counted from the end of spraying). Tell everyone who works there.`
	});
	return out;
}

function reiEnd(targetDate: string, hours: number) {
	const days = Math.floor(hours / 24);
	const rest = hours % 24;
	if (hours === 0) return 'the spray has dried, as the label states';
	return rest === 0
		? `the same time on ${isoPlusDays(targetDate, days)}`
		: `${hours} h later (${days ? `${days} day${days > 1 ? 's' : ''} and ` : ''}${rest} h)`;
}

/** Reads what the checks need for a block: harvest date, latest growth stage, earlier sprays. */
export async function checkContext(
	block: Block,
	exceptId: number | null,
	transaction?: Transaction
): Promise<CheckContext> {
	const [visit, prior] = await Promise.all([
		Visit.findOne({
			where: { blockId: block.id, bbch: { [Op.ne]: null } },
			order: [
				['visitedOn', 'DESC'],
				['id', 'DESC']
			],
			attributes: ['bbch', 'visitedOn'],
			transaction
		}),
		Recommendation.findAll({
			where: {
				blockId: block.id,
				decision: 'treat',
				status: { [Op.in]: ['issued', 'acknowledged', 'applied'] },
				...(exceptId ? { id: { [Op.ne]: exceptId } } : {}),
				...(block.plantingDate ? { targetDate: { [Op.gte]: block.plantingDate } } : {})
			},
			include: [{ model: Product, as: 'product', attributes: ['name', 'iracGroup'] }],
			transaction
		})
	]);
	return {
		expectedHarvest: block.expectedHarvest ?? null,
		bbch: visit?.bbch ?? null,
		bbchOn: visit?.visitedOn ?? null,
		prior: prior.flatMap((r) => {
			const p = (r as Recommendation & { product?: Product }).product;
			return p
				? [
						{
							id: r.id,
							productName: p.name,
							iracGroup: p.iracGroup,
							date: r.appliedOn ?? r.targetDate ?? '',
							status: r.status
						}
					]
				: [];
		})
	};
}
