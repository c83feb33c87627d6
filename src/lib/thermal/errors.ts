/**
 * Bad input to the thermal core. A RangeError subclass so callers that only know the standard
 * error types still catch it; `field` names the offending input (e.g. `layers[2].thicknessM`).
 */
export class ThermalInputError extends RangeError {
	readonly field: string;
	readonly value: unknown;

	constructor(field: string, value: unknown, requirement: string) {
		super(`${field} ${requirement}; got ${formatValue(value)}`);
		this.name = 'ThermalInputError';
		this.field = field;
		this.value = value;
	}
}

function formatValue(value: unknown): string {
	if (typeof value === 'number') return String(value); // keeps NaN / Infinity readable
	if (value === undefined) return 'undefined';
	try {
		const text = JSON.stringify(value);
		return text.length > 80 ? `${text.slice(0, 77)}...` : text;
	} catch {
		return String(value);
	}
}
