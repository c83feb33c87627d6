import { z } from 'zod';
import { readTypedNumber } from '$lib/forms/typed-number';
import { HEAT_FLOW_METHODS } from '$lib/sites/methods';

/**
 * Forms of the site page that add or choose site values and run computations, shared by the page
 * and its actions. Keys are flat (`bhtTemperatureC2`), so `parseForm` puts each message next to
 * its own input; rows left blank are ignored. Numbers accept a decimal comma.
 */

export const BHT_ROWS = 6;
export const STEP_ROWS = 4;

/** A number from a text field: blank → undefined, else finite or an issue with `message`. */
const optionalNumber = (message: string) =>
	z
		.string()
		.optional()
		.transform((s, ctx) => {
			const r = readTypedNumber(s ?? '');
			if (!r.ok) {
				// An ambiguous comma ("1,250") is explained in its own words; anything else gets the field's.
				ctx.addIssue({ code: 'custom', message: r.message.startsWith('“') ? r.message : message });
				return z.NEVER;
			}
			return r.value ?? undefined;
		});

/** Text fields of a table of rows (`name0`, `name1`, …), parsed in the table's own refinement. */
function rowFields(names: readonly string[], rows: number) {
	const shape: Record<string, z.ZodOptional<z.ZodString>> = {};
	for (let i = 0; i < rows; i++) for (const n of names) shape[`${n}${i}`] = z.string().optional();
	return shape;
}

type Ctx = z.core.$RefinementCtx;
const issue = (ctx: Ctx, path: string, message: string) =>
	ctx.addIssue({ code: 'custom', path: [path], message });

/** The number in a row cell: undefined when blank, NaN when not a finite number. */
function cell(v: unknown, key: string): number | undefined {
	const r = readTypedNumber(String((v as Record<string, unknown>)[key] ?? ''));
	return r.ok ? (r.value ?? undefined) : NaN;
}

/** Reads the rows of a table: blank rows skipped, each bad cell reported on its own field. */
function readRows(
	v: unknown,
	ctx: Ctx | null,
	rows: number,
	cols: { key: string; missing: string; min?: number; minMessage?: string }[]
): number[][] {
	const out: number[][] = [];
	for (let i = 0; i < rows; i++) {
		const values = cols.map((c) => cell(v, `${c.key}${i}`));
		if (values.every((x) => x === undefined)) continue;
		let ok = true;
		cols.forEach((c, j) => {
			const x = values[j];
			let message: string | null = null;
			if (x === undefined) message = c.missing;
			else if (Number.isNaN(x)) message = 'Enter a number.';
			else if (c.min !== undefined && !(x > c.min)) message = c.minMessage ?? 'Too small.';
			if (message) {
				ok = false;
				if (ctx) issue(ctx, `${c.key}${i}`, message);
			}
		});
		if (ok) out.push(values as number[]);
		else if (ctx) out.push([]); // counts as entered for the "at least n rows" check
	}
	return out;
}

const BHT_COLUMNS = [
	{ key: 'bhtTemperatureC', missing: 'Enter the temperature (°C).' },
	{
		key: 'bhtShutInH',
		missing: 'Enter the time since circulation (h).',
		min: 0,
		minMessage: 'The time must be more than 0 h.'
	}
];
const STEP_COLUMNS = [
	{ key: 'stepC', missing: 'Enter the change of surface temperature (°C).' },
	{
		key: 'stepAgeYears',
		missing: 'Enter how many years ago.',
		min: 0,
		minMessage: 'The time must be more than 0 years.'
	}
];

export const bhtSchema = z
	.object({
		depthM: optionalNumber('Enter the depth in metres, or leave it blank.'),
		circulationTimeH: optionalNumber('Enter the circulation time in hours.'),
		...rowFields(['bhtTemperatureC', 'bhtShutInH'], BHT_ROWS)
	})
	.superRefine((v, ctx) => {
		if (v.depthM !== undefined && v.depthM < 0) issue(ctx, 'depthM', 'Depth must be 0 m or more.');
		if (v.circulationTimeH === undefined)
			issue(ctx, 'circulationTimeH', 'Enter the circulation time in hours.');
		else if (!(v.circulationTimeH > 0))
			issue(ctx, 'circulationTimeH', 'The circulation time must be more than 0 h.');
		if (readRows(v, ctx, BHT_ROWS, BHT_COLUMNS).length < 2)
			issue(ctx, 'readings', 'Enter at least two readings.');
	})
	.transform((v) => {
		const readings = readRows(v, null, BHT_ROWS, BHT_COLUMNS).map(([t, dt]) => ({
			temperatureC: t,
			shutInTimeH: dt
		}));
		return {
			depthM: v.depthM ?? null,
			circulationTimeH: v.circulationTimeH as number,
			readings
		};
	});

export const palaeoclimateSchema = z
	.object({
		logId: z.string().uuid('Choose a temperature log.'),
		diffusivity: optionalNumber('Enter the diffusivity in 10⁻⁶ m²/s.'),
		...rowFields(['stepC', 'stepAgeYears'], STEP_ROWS)
	})
	.superRefine((v, ctx) => {
		if (v.diffusivity !== undefined && !(v.diffusivity > 0))
			issue(ctx, 'diffusivity', 'The diffusivity must be more than 0.');
		if (readRows(v, ctx, STEP_ROWS, STEP_COLUMNS).length < 1)
			issue(ctx, 'steps', 'Enter at least one step of surface temperature.');
	})
	.transform((v) => {
		const steps = readRows(v, null, STEP_ROWS, STEP_COLUMNS).map(([s, a]) => ({
			stepC: s,
			ageYears: a
		}));
		// Entered in 10⁻⁶ m²/s (the usual magnitude for rock), stored in m²/s.
		return { logId: v.logId, diffusivityM2s: (v.diffusivity ?? 1) * 1e-6, steps };
	});

const required = (message: string) =>
	optionalNumber(message).refine((n) => n !== undefined, { message, abort: true });

export const heatProductionSchema = z.object({
	uraniumPpm: required('Enter uranium in ppm.').refine(
		(n) => n! >= 0,
		'Uranium cannot be negative.'
	),
	thoriumPpm: required('Enter thorium in ppm.').refine(
		(n) => n! >= 0,
		'Thorium cannot be negative.'
	),
	potassiumPct: required('Enter potassium in weight-%.').refine(
		(n) => n! >= 0 && n! <= 100,
		'Potassium is a percentage between 0 and 100.'
	),
	densityKgM3: required('Enter the density in kg/m³.').refine(
		(n) => n! >= 1000 && n! <= 5000,
		'Rock density is between 1000 and 5000 kg/m³ (e.g. 2700).'
	)
});

const nonNegative = (message: string) =>
	optionalNumber(message).refine((n) => n === undefined || n >= 0, 'Cannot be negative.');
const positive = (message: string) =>
	optionalNumber(message).refine((n) => n === undefined || n > 0, 'Must be more than 0.');

export const correctionSchema = z
	.object({
		heatFlowMWm2: required('Enter the heat flow in mW/m².'),
		heatFlowSigmaMWm2: nonNegative('Enter σ in mW/m², or leave it blank.'),
		gradientKPerKm: optionalNumber('Enter the gradient in K/km, or leave it blank.'),
		gradientSigmaKPerKm: nonNegative('Enter σ in K/km, or leave it blank.'),
		conductivityWmK: positive('Enter the conductivity in W/(m·K), or leave it blank.'),
		conductivitySigmaWmK: nonNegative('Enter σ in W/(m·K), or leave it blank.'),
		topDepthM: nonNegative('Enter the top of the interval in m, or leave it blank.'),
		bottomDepthM: nonNegative('Enter the bottom of the interval in m, or leave it blank.'),
		method: z.enum(HEAT_FLOW_METHODS, { message: 'Choose a method.' }),
		reason: z
			.string()
			.trim()
			.min(5, 'Say why the values are corrected (at least 5 characters).')
			.max(500, 'Keep the reason under 500 characters.')
	})
	.refine(
		(v) =>
			v.topDepthM === undefined || v.bottomDepthM === undefined || v.bottomDepthM > v.topDepthM,
		{ path: ['bottomDepthM'], message: 'The bottom must be below the top.' }
	)
	.transform((v) => ({
		values: {
			heatFlowMWm2: v.heatFlowMWm2 as number,
			heatFlowSigmaMWm2: v.heatFlowSigmaMWm2 ?? null,
			gradientKPerKm: v.gradientKPerKm ?? null,
			gradientSigmaKPerKm: v.gradientSigmaKPerKm ?? null,
			conductivityWmK: v.conductivityWmK ?? null,
			conductivitySigmaWmK: v.conductivitySigmaWmK ?? null,
			topDepthM: v.topDepthM ?? null,
			bottomDepthM: v.bottomDepthM ?? null,
			method: v.method
		},
		reason: v.reason
	}));

export const chooseRevisionSchema = z.object({
	revisionId: z.string().uuid('Choose a revision.')
});
