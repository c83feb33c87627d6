// Bad input to a geostatistics function is the shared InputError (foundation/errors.ts); this is
// the one failure that is not bad input but a property of the data.

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
