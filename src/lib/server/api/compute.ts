import type { z } from 'zod';
import type { geothermRequestSchema, heatFlowRequestSchema } from '$lib/api/schemas';
import {
	heatFlowFromLog,
	monteCarloGeotherm,
	solveGeotherm,
	type GeothermInput
} from '$lib/thermal';

/** The words of ModelCaution.svelte, carried with every computed geotherm the API returns. */
export const MODEL_CAUTION =
	'Model estimate: a steady-state, one-dimensional conduction model of the inputs given; it ignores groundwater flow, transients and structure not in the data. For drilling and resource decisions follow local regulations and rely on a licensed professional.';

/** A posted crustal model through the thermal core: the central geotherm and its seeded band. */
export function computeGeotherm(req: z.output<typeof geothermRequestSchema>) {
	const model: GeothermInput = {
		surfaceTemperatureC: req.surfaceTemperatureC,
		surfaceHeatFlowMWm2: req.surfaceHeatFlowMWm2,
		basalHeatFlowMWm2: req.basalHeatFlowMWm2,
		depthStepM: req.depthStepM,
		layers: req.layers.map((l) => ({
			thicknessM: l.thicknessM,
			conductivityWmK: l.conductivityWmK,
			heatProductionUWm3: l.heatProductionUWm3,
			heatProductionDecayM: l.heatProductionDecayM,
			conductivityTempCoeffPerK: l.conductivityTempCoeffPerK
		}))
	};
	const profile = solveGeotherm(model);
	const band = monteCarloGeotherm({
		model,
		heatFlowSigmaMWm2: req.heatFlowSigmaMWm2,
		layers: req.layers.map((l) => ({
			conductivitySigmaWmK: l.conductivitySigmaWmK,
			heatProductionSigmaUWm3: l.heatProductionSigmaUWm3
		})),
		samples: req.samples,
		seed: req.seed,
		isothermsC: req.isothermsC
	});
	return {
		depthM: profile.depthM,
		temperatureC: profile.temperatureC,
		heatFlowMWm2: profile.heatFlowMWm2,
		band: {
			p10C: band.p10C,
			p50C: band.p50C,
			p90C: band.p90C,
			surfaceHeatFlowMWm2: band.surfaceHeatFlowMWm2,
			basalHeatFlowMWm2: band.basalHeatFlowMWm2,
			isotherms: band.isotherms,
			samples: band.samples,
			seed: band.seed
		},
		surfaceHeatFlowMWm2: profile.surfaceHeatFlowMWm2,
		basalHeatFlowMWm2: profile.basalHeatFlowMWm2,
		warnings: profile.warnings ?? [],
		caution: MODEL_CAUTION
	};
}

/** Heat flow from a posted log and conductivities (interval or Bullard method). */
export function computeHeatFlow(req: z.output<typeof heatFlowRequestSchema>) {
	return heatFlowFromLog(req);
}
