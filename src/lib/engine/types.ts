/** Where a value came from; kept beside every default so the screen can show it. */
export type Provenance =
	'published' | 'computed' | 'from memory' | 'common practice' | 'assumption';

export interface Sourced<T> {
	value: T;
	source: string;
	provenance: Provenance;
}

/** One named input behind a result, as shown to the agronomist. */
export interface Assumption {
	name: string;
	value: number | string;
	unit: string;
	source: string;
	provenance: Provenance;
}

export type LevelKey = 'calm' | 'stirring' | 'action' | 'severe';

export interface SampleUnitDef {
	code: string;
	name: string;
	unitsPerPlantDefault?: number;
}

export interface CropParams {
	code: string;
	name: string;
	harvestedOrgan: string;
	glucoseReqGPerG: Sourced<number>;
	bushelKg?: Sourced<number>;
	defaultPlantsPerHa: Sourced<number>;
}

export interface FeedingParams {
	morph: 'apterous' | 'alate' | 'mixed';
	bodyMassMg: Sourced<number>;
	ingestionNlPerMgH: Sourced<number>;
	sapSugarGPerL: Sourced<number>;
	excretedSugarFraction: Sourced<number>;
}

export interface PestParams {
	code: string;
	name: string;
	scientificName: string;
	baseTempC: Sourced<number>;
	upperTempC?: Sourced<number>;
	feeding: FeedingParams;
	yieldLoss?: { kind: 'percent-per-cad' | 'kg-per-aphid-per-unit'; value: Sourced<number> };
	doublingDaysRef?: Sourced<number>;
	ddPerGeneration?: Sourced<number>;
}

export interface ThresholdRule {
	cropCode: string;
	pestCode: string;
	bbchFrom: number;
	bbchTo: number;
	sampleUnit: string;
	metric: 'mean' | 'proportion';
	/** A unit is infested at >= this many aphids; default 1. */
	tallyThreshold?: number;
	action: number;
	injury?: number;
	requiresRising?: boolean;
	/** Share of units that must also be infested (tally 1), e.g. 0.8 for soybean. */
	alsoProportion?: number;
	/** Calendar window 'MM-DD' (inclusive) where a source gives dates rather than stages. */
	seasonFrom?: string;
	seasonTo?: string;
	label: string;
	source: string;
	provenance: Provenance;
}

export interface UnitCount {
	aphids?: number;
	alate?: number;
	/** Presence-absence units: aphids may be omitted. */
	infested?: boolean;
}

export interface Predators {
	ladybeetle?: number;
	lacewing?: number;
	hoverfly?: number;
	other?: number;
}

export interface VisitInput {
	id?: string | number;
	date: string;
	bbch?: number;
	sampleUnit: string;
	units: UnitCount[];
	/** Mummified aphids counted on the same units. */
	mummies?: number;
	predators?: Predators;
}

export interface WeatherDay {
	date: string;
	tminC: number;
	tmaxC: number;
}

/** The share of mummies that changes the advice (see enemies.ts). */
export interface EnemyRules {
	selectiveBelow: Sourced<number>;
	doNotTreatAbove: Sourced<number>;
	populationsHeldAt: Sourced<number>;
}

export interface BlockParams {
	areaHa: number;
	plantsPerHa: number;
	unitsPerPlant?: number;
	expectedYieldKgHa?: number;
	pricePerKg?: number;
	rescoutDays?: number;
}

export interface AssessBlockInput {
	asOf: string;
	crop: CropParams;
	pest: PestParams;
	thresholds: ThresholdRule[];
	block: BlockParams;
	visits: VisitInput[];
	weather?: WeatherDay[];
	sampleUnits?: SampleUnitDef[];
	enemyRules?: EnemyRules;
	/** How many of the latest visits the trend is fitted over; default 4. */
	trendWindow?: number;
}
