/**
 * Bad input to a geostatistics function. `field` names the offending input
 * (e.g. `samples[3].x`, `grid.dx`, `v.rangeM`) and `value` holds what was passed.
 * A RangeError subclass so callers can catch every input problem with one check.
 */
export class GeostatsInputError extends RangeError {
	readonly field: string;
	readonly value: unknown;

	constructor(field: string, value: unknown, problem: string) {
		super(`${field} ${problem} (got ${describe(value)})`);
		this.name = 'GeostatsInputError';
		this.field = field;
		this.value = value;
	}
}

/**
 * A kriging system that cannot be solved reliably (numerically singular), e.g. two
 * samples at almost the same place with no nugget and no sigma.
 */
export class SingularSystemError extends Error {
	/** Indices (into the caller's samples array) of the samples in the failed system. */
	readonly sampleIndices: number[];

	constructor(message: string, sampleIndices: number[]) {
		super(message);
		this.name = 'SingularSystemError';
		this.sampleIndices = sampleIndices;
	}
}

function describe(value: unknown): string {
	if (typeof value === 'number') return Number.isNaN(value) ? 'NaN' : String(value);
	if (value === undefined) return 'undefined';
	if (value === null) return 'null';
	if (Array.isArray(value)) return `an array of length ${value.length}`;
	if (typeof value === 'object') return 'an object';
	return JSON.stringify(value) ?? String(value);
}
