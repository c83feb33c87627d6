// Chart data for a Horner plot of bottom-hole temperatures: temperature against the Horner time
// ratio (tc + Δt)/Δt on a logarithmic axis, with the fitted straight line down to ratio 1 (infinite
// shut-in), where it meets the formation temperature (Horner 1951; Dowdle & Cobb 1975;
// docs/science.md#borehole-heat-flow). The fit is the thermal core's; this only pairs points with
// line ends and picks ticks.

import { hornerFormationTemperature, type HornerEstimate } from '$lib/thermal';

export interface HornerReadingInput {
	temperatureC: number;
	shutInTimeH: number;
}

export interface HornerChartData {
	/** One per reading: its Horner ratio, ln of it (the plotted position) and temperature. */
	points: { ratio: number; lnRatio: number; temperatureC: number; shutInTimeH: number }[];
	/** Fitted line from ln ratio 0 (ratio 1, the formation temperature) to the largest ratio. */
	line: { fromLn: number; fromC: number; toLn: number; toC: number };
	/** Ratio ticks 1, 2, 5, 10, 20, … up to the largest ratio, with their plotted position. */
	ratioTicks: { ratio: number; lnRatio: number }[];
	estimate: HornerEstimate;
}

/** Points, fitted line and ticks of a Horner plot; throws InputError like the core. */
export function hornerChartData(
	readings: readonly HornerReadingInput[],
	circulationTimeH: number
): HornerChartData {
	const estimate = hornerFormationTemperature([...readings], circulationTimeH);
	const points = readings.map((r) => {
		const ratio = (circulationTimeH + r.shutInTimeH) / r.shutInTimeH;
		return {
			ratio,
			lnRatio: Math.log(ratio),
			temperatureC: r.temperatureC,
			shutInTimeH: r.shutInTimeH
		};
	});
	const toLn = Math.max(...points.map((p) => p.lnRatio));
	// T = T∞ − m ln(ratio): the core's slopeC is m.
	const line = {
		fromLn: 0,
		fromC: estimate.formationTemperatureC,
		toLn,
		toC: estimate.formationTemperatureC - estimate.slopeC * toLn
	};
	const maxRatio = Math.exp(toLn);
	const ratioTicks: { ratio: number; lnRatio: number }[] = [];
	for (let decade = 1; decade <= maxRatio * 1.0000001; decade *= 10) {
		for (const m of [1, 2, 5]) {
			const ratio = m * decade;
			if (ratio <= maxRatio * 1.0000001) ratioTicks.push({ ratio, lnRatio: Math.log(ratio) });
		}
	}
	return { points, line, ratioTicks, estimate };
}
