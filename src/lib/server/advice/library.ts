import { error } from '@sveltejs/kit';
import { Op } from 'sequelize';
import type { z } from 'zod';
import type { productSchema, thresholdSchema } from '$lib/schemas/advice';
import { db } from '../db';
import {
	Block,
	Crop,
	Pest,
	Product,
	Recommendation,
	SampleUnit,
	ThresholdRule
} from '../db/models';
import { reassessOrRefuse } from '../assessments';
import { audit } from './audit';

type ProductInput = z.infer<typeof productSchema>;
type ThresholdInput = z.infer<typeof thresholdSchema>;

export type LibraryResult =
	{ ok: true; id: number } | { ok: false; field: string; message: string };

const diff = (before: Record<string, unknown>, after: Record<string, unknown>) =>
	Object.fromEntries(
		Object.keys(after)
			.filter((k) => before[k] !== after[k])
			.map((k) => [k, { from: before[k] ?? null, to: after[k] ?? null }])
	);

export function productsOf(organisationId: number, activeOnly = false) {
	return Product.findAll({
		where: { organisationId, ...(activeOnly ? { active: true } : {}) },
		order: [
			['active', 'DESC'],
			['name', 'ASC']
		],
		raw: true
	});
}

/** Adds or changes a product; the audit entry lists what changed. */
export async function saveProduct(user: SessionUser, input: ProductInput): Promise<LibraryResult> {
	const values = {
		name: input.name,
		activeIngredient: input.activeIngredient,
		iracGroup: input.iracGroup,
		rate: input.rate,
		rateUnit: input.rateUnit,
		reiHours: input.reiHours,
		phiDays: input.phiDays,
		beeHazard: input.beeHazard as Product['beeHazard'],
		notes: input.notes || null
	};
	return db().transaction(async (t) => {
		const clash = await Product.findOne({
			where: {
				organisationId: user.organisationId,
				name: values.name,
				...(input.id ? { id: { [Op.ne]: input.id } } : {})
			},
			transaction: t
		});
		if (clash)
			return { ok: false, field: 'name', message: 'Your list already has a product of that name.' };
		if (input.id) {
			const p = await Product.findOne({
				where: { id: input.id, organisationId: user.organisationId },
				transaction: t,
				lock: t.LOCK.UPDATE
			});
			if (!p) error(404, 'No such product.');
			const changes = diff(p.get({ plain: true }), values);
			await p.update(values, { transaction: t });
			await audit(
				{
					organisationId: user.organisationId,
					actorId: user.id,
					action: 'changed',
					entity: 'product',
					entityId: p.id,
					details: { name: p.name, changes }
				},
				t
			);
			return { ok: true, id: p.id };
		}
		const p = await Product.create(
			{ ...values, organisationId: user.organisationId },
			{ transaction: t }
		);
		await audit(
			{
				organisationId: user.organisationId,
				actorId: user.id,
				action: 'added',
				entity: 'product',
				entityId: p.id,
				details: values
			},
			t
		);
		return { ok: true, id: p.id };
	});
}

/** Takes a product off (or back on) the list; recommendations keep pointing at it. */
export async function setProductActive(user: SessionUser, id: number, active: boolean) {
	await db().transaction(async (t) => {
		const p = await Product.findOne({
			where: { id, organisationId: user.organisationId },
			transaction: t
		});
		if (!p) error(404, 'No such product.');
		await p.update({ active }, { transaction: t });
		await audit(
			{
				organisationId: user.organisationId,
				actorId: user.id,
				action: active ? 'restored' : 'retired',
				entity: 'product',
				entityId: p.id,
				details: { name: p.name }
			},
			t
		);
	});
}

export async function productInUse(id: number) {
	return (await Recommendation.count({ where: { productId: id } })) > 0;
}

/** Library defaults and the organisation's own rules, with names, for the threshold screen. */
export async function thresholdLibrary(organisationId: number) {
	const [rules, crops, pests, units] = await Promise.all([
		ThresholdRule.findAll({
			where: { organisationId: { [Op.or]: [organisationId, null] } },
			include: [
				{ model: Crop, as: 'crop', attributes: ['name'] },
				{ model: Pest, as: 'pest', attributes: ['name'] },
				{ model: SampleUnit, as: 'sampleUnit', attributes: ['name', 'code'] }
			],
			order: [
				['cropId', 'ASC'],
				['pestId', 'ASC'],
				['bbchFrom', 'ASC'],
				['id', 'ASC']
			]
		}),
		Crop.findAll({ attributes: ['id', 'name'], order: [['name', 'ASC']], raw: true }),
		Pest.findAll({ attributes: ['id', 'name'], order: [['name', 'ASC']], raw: true }),
		SampleUnit.findAll({ attributes: ['id', 'name'], order: [['name', 'ASC']], raw: true })
	]);
	return {
		rules: rules.map((r) => {
			const x = r as ThresholdRule & { crop: Crop; pest: Pest; sampleUnit: SampleUnit };
			return {
				...r.get({ plain: true }),
				createdAt: undefined,
				updatedAt: undefined,
				crop: x.crop.name,
				pest: x.pest.name,
				sampleUnit: x.sampleUnit.name,
				own: r.organisationId === organisationId
			};
		}),
		crops,
		pests,
		units
	};
}

/** Re-runs the level of the organisation's blocks of a crop and pest after a rule change. */
async function reassessAffected(
	organisationId: number,
	cropId: number,
	pestId: number,
	t: import('sequelize').Transaction
) {
	const blocks = await Block.findAll({
		where: { organisationId, cropId, pestId },
		attributes: ['id'],
		transaction: t
	});
	for (const b of blocks) await reassessOrRefuse(b.id, { transaction: t });
	return blocks.length;
}

/** Adds or changes an own threshold rule, audits it and reassesses the blocks it affects. */
export async function saveThreshold(
	user: SessionUser,
	input: ThresholdInput
): Promise<LibraryResult> {
	const values = {
		cropId: input.cropId,
		pestId: input.pestId,
		sampleUnitId: input.sampleUnitId,
		bbchFrom: input.bbchFrom,
		bbchTo: input.bbchTo,
		metric: input.metric,
		tallyThreshold: input.tallyThreshold ?? null,
		action: input.action,
		injury: input.injury ?? null,
		requiresRising: input.requiresRising,
		alsoProportion: input.alsoProportion ?? null,
		label: input.label,
		source: input.source,
		provenance: input.provenance as ThresholdRule['provenance']
	};
	return db().transaction(async (t) => {
		const [crop, pest, unit] = await Promise.all([
			Crop.findByPk(values.cropId, { transaction: t }),
			Pest.findByPk(values.pestId, { transaction: t }),
			SampleUnit.findByPk(values.sampleUnitId, { transaction: t })
		]);
		if (!crop) return { ok: false, field: 'cropId', message: 'Choose a crop from the list.' };
		if (!pest) return { ok: false, field: 'pestId', message: 'Choose a pest from the list.' };
		if (!unit)
			return { ok: false, field: 'sampleUnitId', message: 'Choose a sample unit from the list.' };
		let id: number;
		if (input.id) {
			const r = await ThresholdRule.findOne({
				where: { id: input.id, organisationId: user.organisationId },
				transaction: t,
				lock: t.LOCK.UPDATE
			});
			if (!r) error(404, 'No such rule of your organisation.');
			const changes = diff(r.get({ plain: true }), values);
			await r.update(values, { transaction: t });
			id = r.id;
			await audit(
				{
					organisationId: user.organisationId,
					actorId: user.id,
					action: 'changed',
					entity: 'threshold-rule',
					entityId: id,
					details: { label: r.label, changes }
				},
				t
			);
		} else {
			const r = await ThresholdRule.create(
				{ ...values, organisationId: user.organisationId },
				{ transaction: t }
			);
			id = r.id;
			await audit(
				{
					organisationId: user.organisationId,
					actorId: user.id,
					action: 'added',
					entity: 'threshold-rule',
					entityId: id,
					details: values
				},
				t
			);
		}
		await reassessAffected(user.organisationId, values.cropId, values.pestId, t);
		return { ok: true, id };
	});
}

/** Switches an own rule off or on (library defaults are shared and cannot be changed here). */
export async function setThresholdActive(user: SessionUser, id: number, active: boolean) {
	await db().transaction(async (t) => {
		const r = await ThresholdRule.findOne({
			where: { id, organisationId: user.organisationId },
			transaction: t
		});
		if (!r) error(404, 'No such rule of your organisation.');
		await r.update({ active }, { transaction: t });
		await audit(
			{
				organisationId: user.organisationId,
				actorId: user.id,
				action: active ? 'restored' : 'retired',
				entity: 'threshold-rule',
				entityId: r.id,
				details: { label: r.label }
			},
			t
		);
		await reassessAffected(user.organisationId, r.cropId, r.pestId, t);
	});
}
