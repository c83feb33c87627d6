/**
 * Bad input to a pure computation (thermal core, geostatistics, site chart). One type for all of
 * them so a caller (form, route, worker) needs one `instanceof` check. A RangeError subclass so
 * code that only knows the standard errors still catches it. `field` names the offending input
 * (e.g. `layers[2].thicknessM`, `samples[3].x`) and `value` holds what was passed.
 * Message style, everywhere: "<field> <requirement>; got <value>".
 */
export class InputError extends RangeError {
	readonly field: string;
	readonly value: unknown;
	/** What the value must satisfy, e.g. "must be > 0", so a form can restate it under its own label. */
	readonly requirement: string;

	constructor(field: string, value: unknown, requirement: string) {
		super(`${field} ${requirement}; got ${describeValue(value)}`);
		this.name = 'InputError';
		this.field = field;
		this.value = value;
		this.requirement = requirement;
	}
}

/** A short, readable rendering of any input value for an error message. */
export function describeValue(value: unknown): string {
	if (typeof value === 'number') return String(value); // keeps NaN / Infinity readable
	if (value === undefined) return 'undefined';
	if (value === null) return 'null';
	// Large arrays (thousands of samples) are summarised rather than serialised.
	if (Array.isArray(value) && value.length > 8) return `an array of length ${value.length}`;
	try {
		const text = JSON.stringify(value) ?? String(value);
		return text.length > 80 ? `${text.slice(0, 77)}...` : text;
	} catch {
		return String(value);
	}
}
