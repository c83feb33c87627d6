import { fail } from '@sveltejs/kit';
import { version } from '$app/environment';
import { z } from 'zod';
import {
	parseConductivitySamples,
	parseLas,
	temperatureLogFromCsv,
	temperatureLogFromLas,
	ImportFormatError
} from '$lib/imports';
import { palaeoclimateChartData } from '$lib/chart-data';
import { parseForm } from '$lib/schemas/form';
import {
	bhtSchema,
	chooseRevisionSchema,
	correctionSchema,
	heatProductionSchema,
	palaeoclimateSchema
} from '$lib/schemas/site-values';
import { revisionRows } from '$lib/sites/revisions';
import {
	heatFlowFromLog,
	heatProductionUWm3,
	hornerFormationTemperature,
	InputError
} from '$lib/thermal';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import {
	addTemperatureLog,
	editableSite as editable,
	replaceConductivitySamples
} from '$lib/server/repositories/site-data';
import { siteForViewer, siteMeasurements } from '$lib/server/repositories/site-detail';
import {
	addCorrection,
	chooseCurrentRevision,
	recordHeatFlowComputation,
	recordSiteComputation,
	siteRevisions
} from '$lib/server/repositories/site-values';
import { citationFields } from '$lib/datasets/citation';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

const MAX_LOG_BYTES = 5 * 1024 * 1024;

export const load: PageServerLoad = async ({ params, locals, url }) => {
	const db = getDb();
	const found = await siteForViewer(db, locals.viewer, params.id);
	const [m, revisions] = await Promise.all([
		siteMeasurements(db, locals.viewer, params.id),
		siteRevisions(db, locals.viewer, params.id)
	]);
	const heatFlowComputations = m.computations.filter((c) => c.kind === 'heat_flow');
	const otherComputations = m.computations.filter((c) => c.kind !== 'heat_flow');
	return {
		site: { ...found.site, lon: found.lon, lat: found.lat },
		dataset: {
			id: found.dataset.id,
			title: found.dataset.title,
			licence: found.dataset.licence,
			// The dataset version's citation, built once (datasets/citation.ts).
			citation: citationFields(found.dataset, found.organisationName, url.origin).citation
		},
		organisationName: found.organisationName,
		can: { edit: found.can.upload },
		logs: m.logs.map((l) => ({
			id: l.id,
			name: l.name,
			depthM: l.depthM,
			temperatureC: l.temperatureC,
			createdAt: l.createdAt
		})),
		samples: m.samples.map((s) => ({
			topM: s.topM,
			bottomM: s.bottomM,
			conductivityWmK: s.conductivityWmK,
			sigmaWmK: s.sigmaWmK ?? undefined
		})),
		computations: heatFlowComputations.map((c) => ({
			id: c.id,
			method: c.method ?? 'interval',
			fromM: c.fromM ?? 0,
			toM: c.toM ?? 0,
			heatFlowMWm2: c.heatFlowMWm2 ?? 0,
			sigmaMWm2: c.sigmaMWm2 ?? 0,
			samples: c.samples ?? 0,
			engineVersion: c.engineVersion,
			createdAt: c.createdAt
		})),
		/** Horner, palaeoclimate and heat-production results with their inputs, newest first. */
		siteComputations: otherComputations.map((c) => ({
			id: c.id,
			kind: c.kind,
			inputs: c.inputs,
			result: c.result,
			engineVersion: c.engineVersion,
			createdAt: c.createdAt
		})),
		revisions: revisionRows(found.site, revisions, found.site.currentRevisionId),
		files: m.files
	};
};

/** The site, if the user may change it (uploader of its dataset, confirmed address). */
async function editableSite(event: RequestEvent) {
	requireUser(event, 'action');
	return editable(getDb(), event.locals.viewer, event.params.id);
}

async function uploadedText(
	form: FormData,
	name: string
): Promise<{ text: string; fileName: string } | string> {
	const file = form.get(name);
	if (!(file instanceof File) || file.size === 0) return 'Choose a file first.';
	if (file.size > MAX_LOG_BYTES)
		return `The file is larger than ${MAX_LOG_BYTES / 1024 / 1024} MB.`;
	return { text: await file.text(), fileName: file.name };
}

const computeSchema = z
	.object({
		logId: z.string().uuid('Choose a temperature log.'),
		method: z.enum(['interval', 'bullard']),
		fromM: z.coerce.number({ message: 'Enter the top of the fitted range in metres.' }).min(0),
		toM: z.coerce.number({ message: 'Enter the bottom of the fitted range in metres.' }).positive(),
		save: z.string().optional()
	})
	.refine((v) => v.toM > v.fromM, {
		path: ['toM'],
		message: 'The bottom of the range must be below its top.'
	});

export const actions: Actions = {
	log: async (event) => {
		const target = await editableSite(event);
		const form = await event.request.formData();
		const upload = await uploadedText(form, 'file');
		if (typeof upload === 'string') return fail(400, { form: 'log', message: upload });
		try {
			const isLas = /\.las$/i.test(upload.fileName) || upload.text.trimStart().startsWith('~');
			const log = isLas
				? temperatureLogFromLas(parseLas(upload.text))
				: temperatureLogFromCsv(upload.text, {
						depthUnit: String(form.get('depthUnit') ?? 'm'),
						temperatureUnit: String(form.get('temperatureUnit') ?? 'degC')
					});
			if (!log.ok || log.depthM.length < 3) {
				return fail(400, {
					form: 'log',
					message:
						log.issues.map((i) => i.message).join(' ') ||
						'The log needs at least 3 readable points.'
				});
			}
			await addTemperatureLog(getDb(), event.locals.viewer, target, {
				name: upload.fileName,
				sourceFileName: upload.fileName,
				depthM: log.depthM,
				temperatureC: log.temperatureC
			});
			return { form: 'log', saved: log.depthM.length, notes: log.issues.map((i) => i.message) };
		} catch (err) {
			if (err instanceof ImportFormatError) return fail(400, { form: 'log', message: err.message });
			throw err;
		}
	},
	conductivity: async (event) => {
		const target = await editableSite(event);
		const upload = await uploadedText(await event.request.formData(), 'file');
		if (typeof upload === 'string') return fail(400, { form: 'conductivity', message: upload });
		try {
			const parsed = parseConductivitySamples(upload.text);
			if (!parsed.ok || parsed.intervals.length === 0) {
				return fail(400, {
					form: 'conductivity',
					message: parsed.issues.map((i) => i.message).join(' ') || 'No samples found.'
				});
			}
			await replaceConductivitySamples(getDb(), target, parsed.intervals);
			return { form: 'conductivity', saved: parsed.intervals.length };
		} catch (err) {
			if (err instanceof ImportFormatError)
				return fail(400, { form: 'conductivity', message: err.message });
			throw err;
		}
	},
	compute: async (event) => {
		const target = await editableSite(event);
		const raw = Object.fromEntries(await event.request.formData());
		const parsed = computeSchema.safeParse(raw);
		if (!parsed.success)
			return fail(400, { form: 'compute', message: parsed.error.issues[0].message });
		const { logId, method, fromM, toM, save } = parsed.data;
		const db = getDb();
		const m = await siteMeasurements(db, event.locals.viewer, event.params.id);
		const log = m.logs.find((l) => l.id === logId);
		if (!log)
			return fail(404, { form: 'compute', message: 'That log does not belong to this site.' });
		if (m.samples.length === 0)
			return fail(400, {
				form: 'compute',
				message: 'Upload conductivity samples covering the range first.'
			});
		let estimate;
		try {
			estimate = heatFlowFromLog({
				depthM: log.depthM,
				temperatureC: log.temperatureC,
				conductivity: m.samples.map((s) => ({
					topM: s.topM,
					bottomM: s.bottomM,
					conductivityWmK: s.conductivityWmK,
					sigmaWmK: s.sigmaWmK ?? undefined
				})),
				method,
				fromM,
				toM
			});
		} catch (err) {
			if (err instanceof InputError) return fail(400, { form: 'compute', message: err.message });
			throw err;
		}
		const stored = await recordHeatFlowComputation(
			db,
			event.locals.viewer,
			target,
			{
				logId,
				method,
				fromM,
				toM,
				heatFlowMWm2: estimate.heatFlowMWm2,
				sigmaMWm2: estimate.sigmaMWm2,
				gradientKPerKm: estimate.gradientKPerKm,
				sigmaGradientKPerKm: estimate.sigmaGradientKPerKm,
				meanConductivityWmK: estimate.meanConductivityWmK,
				samples: estimate.samples,
				engineVersion: `thermalith ${version}`
			},
			save
				? {
						conductivitySamples: m.samples.length,
						sigmaMeanConductivityWmK: estimate.sigmaMeanConductivityWmK
					}
				: null
		);
		return {
			form: 'compute',
			estimate,
			saved: Boolean(save),
			revisionId: stored.revisionId,
			// Samples without σ add nothing to the ± (docs/science.md#borehole-heat-flow): say so.
			samplesWithoutSigma: m.samples.filter((s) => s.sigmaWmK === null).length
		};
	},
	correct: async (event) => {
		const target = await editableSite(event);
		const parsed = parseForm(correctionSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { form: 'correct', ...parsed });
		const { values, reason } = parsed.data;
		const revisionId = await addCorrection(getDb(), event.locals.viewer, target, values, reason);
		return { form: 'correct', revisionId };
	},
	choose: async (event) => {
		const target = await editableSite(event);
		const parsed = parseForm(chooseRevisionSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { form: 'choose', message: parsed.errors.revisionId });
		const done = await chooseCurrentRevision(
			getDb(),
			event.locals.viewer,
			target,
			parsed.data.revisionId
		);
		if (!done)
			return fail(404, { form: 'choose', message: 'That revision does not belong to this site.' });
		return { form: 'choose', chosen: parsed.data.revisionId };
	},
	bht: async (event) => {
		const target = await editableSite(event);
		const parsed = parseForm(bhtSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { form: 'bht', ...parsed });
		const inputs = parsed.data;
		let estimate;
		try {
			estimate = hornerFormationTemperature(inputs.readings, inputs.circulationTimeH);
		} catch (err) {
			if (err instanceof InputError)
				return fail(400, { form: 'bht', errors: { readings: err.message }, values: {} });
			throw err;
		}
		await recordSiteComputation(
			getDb(),
			event.locals.viewer,
			target,
			'horner_bht',
			{ ...inputs },
			{ ...estimate },
			`thermalith ${version}`
		);
		return { form: 'bht', horner: estimate };
	},
	palaeoclimate: async (event) => {
		const target = await editableSite(event);
		const parsed = parseForm(palaeoclimateSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { form: 'palaeoclimate', ...parsed });
		const { logId, diffusivityM2s, steps } = parsed.data;
		const m = await siteMeasurements(getDb(), event.locals.viewer, event.params.id);
		const log = m.logs.find((l) => l.id === logId);
		if (!log)
			return fail(404, {
				form: 'palaeoclimate',
				errors: { logId: 'That log does not belong to this site.' },
				values: {}
			});
		let chart;
		try {
			chart = palaeoclimateChartData(log.depthM, log.temperatureC, steps, diffusivityM2s);
		} catch (err) {
			if (err instanceof InputError)
				return fail(400, { form: 'palaeoclimate', errors: { steps: err.message }, values: {} });
			throw err;
		}
		const correctedName = `${log.name} (palaeoclimate-corrected)`;
		await recordSiteComputation(
			getDb(),
			event.locals.viewer,
			target,
			'palaeoclimate',
			{ logId, logName: log.name, diffusivityM2s, steps },
			{
				points: chart.depthM.length,
				gradientBeforeKPerKm: chart.gradientBeforeKPerKm,
				gradientAfterKPerKm: chart.gradientAfterKPerKm,
				maxPerturbationC: chart.maxPerturbationC
			},
			`thermalith ${version}`,
			{ name: correctedName, depthM: chart.depthM, temperatureC: chart.correctedC, logId }
		);
		return { form: 'palaeoclimate', correctedName, chart };
	},
	heatProduction: async (event) => {
		const target = await editableSite(event);
		const parsed = parseForm(heatProductionSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { form: 'heatProduction', ...parsed });
		const inputs = {
			uraniumPpm: parsed.data.uraniumPpm as number,
			thoriumPpm: parsed.data.thoriumPpm as number,
			potassiumPct: parsed.data.potassiumPct as number,
			densityKgM3: parsed.data.densityKgM3 as number
		};
		const a = heatProductionUWm3(inputs);
		await recordSiteComputation(
			getDb(),
			event.locals.viewer,
			target,
			'heat_production',
			inputs,
			{ heatProductionUWm3: a },
			`thermalith ${version}`
		);
		return { form: 'heatProduction', heatProductionUWm3: a };
	}
};
