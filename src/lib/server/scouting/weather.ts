import Papa from 'papaparse';
import { Op } from 'sequelize';
import { z } from 'zod';
import { db, WeatherDay } from '../db';
import type { CsvIssue } from './csv';

const row = z
	.object({
		date: z.iso.date('date must be YYYY-MM-DD'),
		tmin_c: z.coerce
			.number('tmin_c must be a number')
			.min(-50, 'tmin_c below -50')
			.max(50, 'tmin_c above 50'),
		tmax_c: z.coerce
			.number('tmax_c must be a number')
			.min(-50, 'tmax_c below -50')
			.max(60, 'tmax_c above 60')
	})
	.refine((r) => r.tmax_c >= r.tmin_c, { path: ['tmax_c'], message: 'tmax_c is below tmin_c' });

/** Stores (or replaces) one farm day's minimum and maximum. */
export async function upsertDay(
	farmId: number,
	day: string,
	tminC: number,
	tmaxC: number,
	source: 'manual' | 'station-csv' = 'manual'
) {
	await db().transaction(async (transaction) => {
		const existing = await WeatherDay.findOne({ where: { farmId, day }, transaction });
		if (existing) await existing.update({ tminC, tmaxC, source }, { transaction });
		else await WeatherDay.create({ farmId, day, tminC, tmaxC, source }, { transaction });
	});
}

/**
 * Reads a weather-station CSV (date, tmin_c, tmax_c; °C) and, when every row is good and
 * `commit` is set, stores all days in one transaction. A bad row and nothing is stored.
 */
export async function importWeather(farmId: number, text: string, commit: boolean) {
	const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ''), {
		header: true,
		skipEmptyLines: 'greedy',
		transformHeader: (h) => h.trim().toLowerCase()
	});
	const issues: CsvIssue[] = [];
	for (const c of ['date', 'tmin_c', 'tmax_c'])
		if (!parsed.meta.fields?.includes(c))
			issues.push({ row: 1, column: c, message: `the header has no ${c} column` });
	const days: { day: string; tminC: number; tmaxC: number }[] = [];
	const seen = new Map<string, number>();
	if (!issues.length)
		parsed.data.forEach((raw, i) => {
			const r = row.safeParse(raw);
			if (!r.success) {
				for (const is of r.error.issues)
					issues.push({ row: i + 2, column: String(is.path[0] ?? ''), message: is.message });
				return;
			}
			if (seen.has(r.data.date))
				issues.push({
					row: i + 2,
					column: 'date',
					message: `${r.data.date} is also on line ${seen.get(r.data.date)}`
				});
			seen.set(r.data.date, i + 2);
			days.push({ day: r.data.date, tminC: r.data.tmin_c, tmaxC: r.data.tmax_c });
		});
	if (!parsed.data.length && !issues.length)
		issues.push({ row: 2, column: '', message: 'the file has no rows' });
	if (issues.length || !commit) return { days, issues, stored: 0 };
	await db().transaction(async (transaction) => {
		await WeatherDay.destroy({
			where: { farmId, day: { [Op.in]: days.map((d) => d.day) } },
			transaction
		});
		await WeatherDay.bulkCreate(
			days.map((d) => ({ ...d, farmId, source: 'station-csv' as const })),
			{ transaction }
		);
	});
	return { days, issues, stored: days.length };
}

export async function recentDays(farmId: number, limit = 21) {
	const rows = await WeatherDay.findAll({ where: { farmId }, order: [['day', 'DESC']], limit });
	return rows.map((w) => ({ day: w.day, tminC: w.tminC, tmaxC: w.tmaxC, source: w.source }));
}
