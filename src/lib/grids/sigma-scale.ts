/**
 * Colour classes of the kriging standard error (1 σ, mW/m²) for the σ overlay and its legend:
 * the product's own sequential ramp, pale where the estimate is tight, dark where it is loose.
 */
const BREAKS_MWM2 = [3, 6, 10, 15, 20, 30];
const COLOURS = ['#f2f0e6', '#d9d4bf', '#b9b097', '#948a72', '#6f6654', '#4c4539', '#2d2921'];

export const SIGMA_CLASSES = COLOURS.map((colour, i) => {
	const min = i === 0 ? -Infinity : BREAKS_MWM2[i - 1];
	const max = i === BREAKS_MWM2.length ? Infinity : BREAKS_MWM2[i];
	const label = i === 0 ? `< ${max}` : max === Infinity ? `≥ ${min}` : `${min}–${max}`;
	return { minMWm2: min, maxMWm2: max, colour, label };
});

export function sigmaColour(sigmaMWm2: number): string {
	const found = SIGMA_CLASSES.find((c) => sigmaMWm2 >= c.minMWm2 && sigmaMWm2 < c.maxMWm2);
	return (found ?? SIGMA_CLASSES[SIGMA_CLASSES.length - 1]).colour;
}
