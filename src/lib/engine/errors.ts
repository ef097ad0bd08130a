/** Invalid input to the engine; `field` names the offending input path. */
export class EngineInputError extends Error {
	constructor(
		public field: string,
		message: string
	) {
		super(`${field}: ${message}`);
		this.name = 'EngineInputError';
	}
}

/** A finite number, or an error naming the field. */
export function finite(v: unknown, field: string): number {
	if (typeof v !== 'number' || !Number.isFinite(v))
		throw new EngineInputError(field, 'must be a finite number');
	return v;
}

export function positive(v: unknown, field: string): number {
	if (finite(v, field) <= 0) throw new EngineInputError(field, 'must be greater than zero');
	return v as number;
}

export function nonNegative(v: unknown, field: string): number {
	if (finite(v, field) < 0) throw new EngineInputError(field, 'must not be negative');
	return v as number;
}

/** A whole count of zero or more. */
export function count(v: unknown, field: string): number {
	if (!Number.isInteger(v) || (v as number) < 0) {
		throw new EngineInputError(field, 'must be a whole number of zero or more');
	}
	return v as number;
}

/** A probability strictly between 0 and 1. */
export function openUnit(v: unknown, field: string): number {
	const p = finite(v, field);
	if (p <= 0 || p >= 1) throw new EngineInputError(field, 'must be between 0 and 1 (exclusive)');
	return p;
}
