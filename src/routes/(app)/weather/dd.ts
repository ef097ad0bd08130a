import { library, singleSineDd } from '$lib/engine';

interface Day {
	day: string;
	tminC: number;
	tmaxC: number;
	source: string;
}

const SOY = library.PESTS.find((p) => p.code === 'soybean-aphid')!;
/** The base shown beside the table (the engine uses each block's own pest base). */
export const DD_BASE = SOY.baseTempC;

/** Each day's single-sine degree-days above the soybean aphid base, for display. */
export function singleDegreeDaysSine(days: Day[]) {
	return days.map((d) => ({ ...d, dd: singleSineDd(d.tminC, d.tmaxC, DD_BASE.value) }));
}
