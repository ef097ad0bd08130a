import type { TrendFit } from './trend';

/** A density for a reason line: one decimal below 10, whole numbers above. */
export function fmtNum(v: number): string {
	if (v === 0) return '0';
	if (v < 10) return (Math.round(v * 10) / 10).toString();
	return String(Math.round(v)).replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}

export function fmtPct(p: number): string {
	return `${Math.round(p * 100)} %`;
}

/** "doubling every 6.5 days", "halving every 4 days", "steady" or "no trend yet". */
export function trendPhrase(t: TrendFit | null): string {
	if (!t) return 'no trend yet';
	const unit = t.basis === 'days' ? 'days' : 'degree-days';
	if (t.doubling !== null && t.doubling < 1000)
		return `doubling every ${fmtNum(t.doubling)} ${unit}`;
	if (t.halving !== null && t.halving < 1000) return `halving every ${fmtNum(t.halving)} ${unit}`;
	return 'steady';
}
