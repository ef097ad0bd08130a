import Papa from 'papaparse';
import { Op } from 'sequelize';
import { z } from 'zod';
import { reassessOrRefuse } from '../assessments';
import { Block, db, SampleUnit, Visit, VisitCount } from '../db';

/** Columns of the counts spreadsheet (the export writes the same ones). */
export const CSV_COLUMNS = [
	'visit_ref',
	'block_id',
	'visited_on',
	'sample_unit',
	'stop',
	'unit',
	'aphids',
	'alate',
	'infested',
	'bbch',
	'air_temp_c',
	'mummies',
	'ladybeetles',
	'lacewings',
	'hoverflies',
	'other_predators',
	'notes'
] as const;
const REQUIRED = ['block_id', 'visited_on', 'sample_unit', 'stop', 'unit'];
export const CSV_MAX_ROWS = 50_000;

const blank = (v: unknown) => (v === '' || v === undefined || v === null ? undefined : v);
const int = (what: string, min = 0, max = 100_000) =>
	z.preprocess(
		blank,
		z.coerce
			.number(`${what} must be a number`)
			.int(`${what} must be a whole number`)
			.min(min, min === 0 ? `${what} cannot be negative` : `${what} must be ${min} or more`)
			.max(max, `${what} must be ${max} or less`)
			.optional()
	);

const rowSchema = z
	.object({
		visit_ref: z.string().max(64).optional(),
		block_id: z.preprocess(blank, z.coerce.number('block_id must be a number').int().positive()),
		visited_on: z.iso.date('visited_on must be a date as YYYY-MM-DD'),
		sample_unit: z.string().trim().min(1, 'sample_unit is required'),
		stop: int('stop', 1, 500),
		unit: int('unit', 1, 100),
		aphids: int('aphids'),
		alate: int('alate'),
		infested: z.preprocess(
			(v) => (blank(v) === undefined ? undefined : String(v).trim().toLowerCase()),
			z.enum(['yes', 'no', 'true', 'false', '1', '0'], 'infested must be yes or no').optional()
		),
		bbch: int('bbch', 0, 99),
		air_temp_c: z.preprocess(
			blank,
			z.coerce.number('air_temp_c must be a number').min(-40).max(60).optional()
		),
		mummies: int('mummies'),
		ladybeetles: int('ladybeetles'),
		lacewings: int('lacewings'),
		hoverflies: int('hoverflies'),
		other_predators: int('other_predators'),
		notes: z.string().max(4000).optional()
	})
	.superRefine((r, ctx) => {
		if (r.stop === undefined)
			ctx.addIssue({ code: 'custom', path: ['stop'], message: 'stop is required' });
		if (r.unit === undefined)
			ctx.addIssue({ code: 'custom', path: ['unit'], message: 'unit is required' });
		if (r.aphids === undefined && r.infested === undefined)
			ctx.addIssue({ code: 'custom', path: ['aphids'], message: 'give aphids or infested' });
		if (r.alate !== undefined && (r.aphids === undefined || r.alate > r.aphids))
			ctx.addIssue({
				code: 'custom',
				path: ['alate'],
				message: 'alate (winged) cannot exceed aphids'
			});
	});
type Row = z.infer<typeof rowSchema>;

export interface CsvIssue {
	/** Line in the file (the header is line 1). */
	row: number;
	column: string;
	message: string;
}

export interface CsvPlan {
	rows: number;
	visits: {
		ref: string;
		blockId: number;
		blockName: string;
		visitedOn: string;
		sampleUnit: string;
		units: number;
		firstRow: number;
	}[];
	issues: CsvIssue[];
}

interface Group {
	key: string;
	blockId: number;
	visitedOn: string;
	sampleUnit: string;
	firstRow: number;
	rows: { line: number; r: Row }[];
}

const VISIT_FIELDS = [
	'bbch',
	'air_temp_c',
	'mummies',
	'ladybeetles',
	'lacewings',
	'hoverflies',
	'other_predators',
	'notes'
] as const;

/** Parses and checks a counts spreadsheet for an organisation; nothing is written. */
export async function planImport(
	text: string,
	organisationId: number
): Promise<CsvPlan & { groups: Group[] }> {
	const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ''), {
		header: true,
		skipEmptyLines: 'greedy',
		transformHeader: (h) => h.trim().toLowerCase()
	});
	const issues: CsvIssue[] = [];
	const fields = parsed.meta.fields ?? [];
	for (const c of REQUIRED)
		if (!fields.includes(c))
			issues.push({ row: 1, column: c, message: `the header has no ${c} column` });
	for (const f of fields)
		if (
			!(CSV_COLUMNS as readonly string[]).includes(f) &&
			f !== 'mode' &&
			f !== 'visit_id' &&
			f !== 'scout'
		)
			issues.push({ row: 1, column: f, message: `unknown column ${f}` });
	for (const e of parsed.errors)
		issues.push({ row: (e.row ?? 0) + 2, column: '', message: e.message });
	if (parsed.data.length > CSV_MAX_ROWS)
		issues.push({
			row: CSV_MAX_ROWS + 2,
			column: '',
			message: `at most ${CSV_MAX_ROWS} rows per file`
		});
	if (issues.length) return { rows: parsed.data.length, visits: [], issues, groups: [] };

	const groups = new Map<string, Group>();
	parsed.data.forEach((raw, i) => {
		const line = i + 2;
		const input = { ...raw, visit_ref: raw.visit_ref || raw.visit_id || undefined };
		const r = rowSchema.safeParse(input);
		if (!r.success) {
			for (const is of r.error.issues)
				issues.push({ row: line, column: String(is.path[0] ?? ''), message: is.message });
			return;
		}
		const d = r.data;
		const key = d.visit_ref
			? `ref:${d.visit_ref}`
			: `${d.block_id}|${d.visited_on}|${d.sample_unit}`;
		let g = groups.get(key);
		if (!g) {
			g = {
				key,
				blockId: d.block_id,
				visitedOn: d.visited_on,
				sampleUnit: d.sample_unit,
				firstRow: line,
				rows: []
			};
			groups.set(key, g);
		} else if (
			g.blockId !== d.block_id ||
			g.visitedOn !== d.visited_on ||
			g.sampleUnit !== d.sample_unit
		) {
			issues.push({
				row: line,
				column: 'visit_ref',
				message: `visit ${d.visit_ref} has another block, date or unit on line ${g.firstRow}`
			});
			return;
		}
		const dup = g.rows.find((x) => x.r.stop === d.stop && x.r.unit === d.unit);
		if (dup)
			issues.push({
				row: line,
				column: 'unit',
				message: `stop ${d.stop} unit ${d.unit} is already on line ${dup.line}`
			});
		for (const f of VISIT_FIELDS) {
			const other = g.rows.find(
				(x) => x.r[f] !== undefined && d[f] !== undefined && x.r[f] !== d[f]
			);
			if (other)
				issues.push({
					row: line,
					column: f,
					message: `${f} differs from line ${other.line} of the same visit`
				});
		}
		g.rows.push({ line, r: d });
	});

	const list = [...groups.values()];
	const blockIds = [...new Set(list.map((g) => g.blockId))];
	const [blocks, units] = await Promise.all([
		Block.findAll({
			where: { id: { [Op.in]: blockIds.length ? blockIds : [0] }, organisationId },
			attributes: ['id', 'name']
		}),
		SampleUnit.findAll({ attributes: ['code'] })
	]);
	const names = new Map(blocks.map((b) => [b.id, b.name]));
	const codes = new Set(units.map((u) => u.code));
	const today = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
	for (const g of list) {
		if (!names.has(g.blockId))
			issues.push({
				row: g.firstRow,
				column: 'block_id',
				message: `no block ${g.blockId} in your organisation`
			});
		if (!codes.has(g.sampleUnit))
			issues.push({
				row: g.firstRow,
				column: 'sample_unit',
				message: `unknown sample unit "${g.sampleUnit}" (use ${[...codes].join(', ')})`
			});
		if (g.visitedOn > today)
			issues.push({ row: g.firstRow, column: 'visited_on', message: 'the date is in the future' });
		// A visit is either counted or presence-absence: a unit without a count in a counted
		// visit would otherwise be read as zero aphids.
		const counted = g.rows.filter((x) => x.r.aphids !== undefined);
		if (counted.length && counted.length < g.rows.length) {
			const gap = g.rows.find((x) => x.r.aphids === undefined)!;
			issues.push({
				row: gap.line,
				column: 'aphids',
				message: `this visit counts aphids on line ${counted[0].line}: give a count on every unit`
			});
		}
	}
	if (!parsed.data.length) issues.push({ row: 2, column: '', message: 'the file has no rows' });
	issues.sort((a, b) => a.row - b.row);
	return {
		rows: parsed.data.length,
		issues,
		groups: list,
		visits: list.map((g) => ({
			ref: g.key.startsWith('ref:') ? g.key.slice(4) : '',
			blockId: g.blockId,
			blockName: names.get(g.blockId) ?? '?',
			visitedOn: g.visitedOn,
			sampleUnit: g.sampleUnit,
			units: g.rows.length,
			firstRow: g.firstRow
		}))
	};
}

const yes = (v: string | undefined) => v === 'yes' || v === 'true' || v === '1';
const first = <K extends (typeof VISIT_FIELDS)[number]>(g: Group, f: K) =>
	g.rows.find((x) => x.r[f] !== undefined)?.r[f];

/**
 * Checks the whole file, then writes every visit and reassesses every block it touches in one
 * transaction: a single bad row and nothing is stored.
 */
export async function commitImport(text: string, user: SessionUser) {
	const plan = await planImport(text, user.organisationId);
	if (plan.issues.length) return { ok: false as const, plan };
	const units = new Map((await SampleUnit.findAll()).map((u) => [u.code, u.id]));
	const blocks = new Map(
		(await Block.findAll({ where: { id: { [Op.in]: plan.groups.map((g) => g.blockId) } } })).map(
			(b) => [b.id, b]
		)
	);
	const visitIds = await db().transaction(async (transaction) => {
		const ids: number[] = [];
		for (const g of plan.groups) {
			const presence = g.rows.every((x) => x.r.aphids === undefined);
			const v = await Visit.create(
				{
					blockId: g.blockId,
					scoutId: user.id,
					pestId: blocks.get(g.blockId)!.pestId,
					sampleUnitId: units.get(g.sampleUnit)!,
					visitedOn: g.visitedOn,
					positionSource: 'none',
					mode: presence ? 'presence' : 'count',
					bbch: first(g, 'bbch') ?? null,
					airTempC: first(g, 'air_temp_c') ?? null,
					mummies: first(g, 'mummies') ?? 0,
					ladybeetles: first(g, 'ladybeetles') ?? 0,
					lacewings: first(g, 'lacewings') ?? 0,
					hoverflies: first(g, 'hoverflies') ?? 0,
					otherPredators: first(g, 'other_predators') ?? 0,
					notes: first(g, 'notes') ?? null,
					entryChannel: 'csv'
				},
				{ transaction }
			);
			await VisitCount.bulkCreate(
				g.rows.map(({ r }) => ({
					visitId: v.id,
					stopNo: r.stop!,
					unitNo: r.unit!,
					aphids: r.aphids ?? null,
					alate: r.alate ?? null,
					infested: r.infested !== undefined ? yes(r.infested) : (r.aphids ?? 0) > 0
				})),
				{ transaction }
			);
			ids.push(v.id);
		}
		for (const blockId of new Set(plan.groups.map((g) => g.blockId)))
			await reassessOrRefuse(blockId, { transaction });
		return ids;
	});
	return { ok: true as const, plan, visitIds };
}

/** A block's visits as CSV rows, one per sample unit (the import reads the same columns). */
export async function visitsCsv(blockId: number) {
	const visits = await Visit.findAll({
		where: { blockId },
		include: [
			{ model: VisitCount, as: 'counts' },
			{ model: SampleUnit, as: 'sampleUnit', attributes: ['code'] }
		],
		order: [
			['visitedOn', 'ASC'],
			['id', 'ASC']
		]
	});
	const rows: (string | number)[][] = [];
	for (const v of visits as (Visit & { counts: VisitCount[]; sampleUnit: SampleUnit })[]) {
		for (const c of v.counts.sort((a, b) => a.stopNo - b.stopNo || a.unitNo - b.unitNo))
			rows.push([
				v.id,
				blockId,
				v.visitedOn,
				v.sampleUnit.code,
				c.stopNo,
				c.unitNo,
				c.aphids ?? '',
				c.alate ?? '',
				c.infested ? 'yes' : 'no',
				v.bbch ?? '',
				v.airTempC ?? '',
				v.mummies,
				v.ladybeetles,
				v.lacewings,
				v.hoverflies,
				v.otherPredators,
				v.notes ?? ''
			]);
	}
	// Notes are free text: a leading = + - @ must not run as a spreadsheet formula.
	return Papa.unparse({ fields: [...CSV_COLUMNS], data: rows }, { escapeFormulae: true });
}
