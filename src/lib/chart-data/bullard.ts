// Chart data for a borehole log: the Bullard plot (temperature against thermal resistance, whose
// slope is the heat flow; Bullard 1939) and the plain temperature–depth view with the fitted
// gradient. All fitting is the thermal core's; this only pairs points with line endpoints.

import {
	bullardPlot,
	heatFlowFromLog,
	temperatureGradient,
	type ConductivityInterval,
	type HeatFlowEstimate
} from '$lib/thermal';
import { kPerKmToKPerM, mWm2ToWm2 } from '$lib/geo/units';

export interface BoreholeLogInput {
	depthM: number[];
	temperatureC: number[];
	conductivity: ConductivityInterval[];
	fromM?: number;
	toM?: number;
}

export type BullardMode = 'resistance' | 'depth';

export interface BullardChartData {
	mode: BullardMode;
	/** Vertical coordinate of each used log point: m²K/W (resistance mode) or m (depth mode). */
	positions: number[];
	temperatureC: number[];
	depthM: number[];
	/** Fitted straight line at the first and last position. */
	line: { fromPosition: number; fromC: number; toPosition: number; toC: number };
	/** Measured minus fitted temperature (°C) at each used point, same order as `positions`. */
	residualsC: number[];
	/** Bullard estimate in resistance mode, interval (k̄ Γ) estimate in depth mode. */
	estimate: HeatFlowEstimate;
}

/** Points and fitted line for one mode; throws InputError like the core. */
export function bullardChartData(input: BoreholeLogInput, mode: BullardMode): BullardChartData {
	const chart = chartWithoutResiduals(input, mode);
	const { fromPosition, fromC, toPosition, toC } = chart.line;
	// The line is straight, so its value at any position follows from its two ends.
	const slope = toPosition === fromPosition ? 0 : (toC - fromC) / (toPosition - fromPosition);
	const residualsC = chart.positions.map(
		(p, i) => chart.temperatureC[i] - (fromC + slope * (p - fromPosition))
	);
	return { ...chart, residualsC };
}

function chartWithoutResiduals(
	input: BoreholeLogInput,
	mode: BullardMode
): Omit<BullardChartData, 'residualsC'> {
	const plot = bullardPlot(input); // validates and windows the log
	if (mode === 'resistance') {
		const estimate = heatFlowFromLog({ ...input, method: 'bullard' });
		const r = plot.thermalResistanceM2KW;
		const rMax = r[r.length - 1];
		// T = T(R=0) + q R, q in W/m² (= K per m²K/W).
		const qWm2 = mWm2ToWm2(estimate.heatFlowMWm2);
		return {
			mode,
			positions: r,
			temperatureC: plot.temperatureC,
			depthM: plot.depthM,
			line: {
				fromPosition: 0,
				fromC: estimate.interceptC,
				toPosition: rMax,
				toC: estimate.interceptC + qWm2 * rMax
			},
			estimate
		};
	}
	const estimate = heatFlowFromLog({ ...input, method: 'interval' });
	const fit = temperatureGradient(input);
	const top = plot.depthM[0];
	const bottom = plot.depthM[plot.depthM.length - 1];
	// The core fits T against depth below the range top, so its intercept is T at `top`.
	return {
		mode,
		positions: plot.depthM,
		temperatureC: plot.temperatureC,
		depthM: plot.depthM,
		line: {
			fromPosition: top,
			fromC: fit.interceptC,
			toPosition: bottom,
			toC: fit.interceptC + kPerKmToKPerM(fit.gradientKPerKm) * (bottom - top)
		},
		estimate
	};
}
