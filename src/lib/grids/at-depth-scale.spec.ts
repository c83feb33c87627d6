import { describe, expect, it } from 'vitest';
import {
	isothermDepthClasses,
	NOT_REACHED_COLOUR,
	overlayColour,
	temperatureClasses,
	VIRIDIS_7
} from './at-depth-scale';

/** Relative luminance of an sRGB colour (WCAG 2.x definition, W3C). */
function luminance(hex: string): number {
	const n = parseInt(hex.slice(1), 16);
	const [r, g, b] = [(n >> 16) & 255, (n >> 8) & 255, n & 255].map((c) => {
		const s = c / 255;
		return s <= 0.03928 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
	});
	return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

describe('at-depth overlay classes', () => {
	it('use a ramp whose lightness rises strictly, so classes differ without hue vision', () => {
		const l = VIRIDIS_7.map(luminance);
		for (let i = 1; i < l.length; i++) expect(l[i]).toBeGreaterThan(l[i - 1] * 1.2);
	});

	it('put the class breaks at 20–50 °C/km from a 10 °C surface: 3 km and 150 °C', () => {
		expect(temperatureClasses(3000).map((c) => c.label)).toEqual([
			'< 70 °C',
			'70–85 °C',
			'85–100 °C',
			'100–115 °C',
			'115–130 °C',
			'130–160 °C',
			'≥ 160 °C'
		]);
		expect(isothermDepthClasses(150).map((c) => c.label)).toEqual([
			'< 2.8 km',
			'2.8–3.5 km',
			'3.5–4.0 km',
			'4.0–4.7 km',
			'4.7–5.6 km',
			'5.6–7.0 km',
			'≥ 7.0 km'
		]);
	});

	it('keep breaks strictly increasing for shallow depths and low isotherms', () => {
		for (const classes of [temperatureClasses(100), isothermDepthClasses(20)]) {
			const breaks = classes.slice(1).map((c) => c.min);
			for (let i = 1; i < breaks.length; i++) expect(breaks[i]).toBeGreaterThan(breaks[i - 1]);
		}
	});

	it('give hot the bright end in both overlays: the same class for the same straight gradient', () => {
		const t = temperatureClasses(3000);
		const d = isothermDepthClasses(150);
		for (const gradient of [15, 22, 27, 33, 37, 45, 60]) {
			const tempAt3km = 10 + gradient * 3;
			const depthKm = 140 / gradient;
			expect(overlayColour(d, depthKm)).toBe(overlayColour(t, tempAt3km));
		}
		expect(overlayColour(t, 500)).toBe(VIRIDIS_7[6]);
		expect(overlayColour(d, 1)).toBe(VIRIDIS_7[6]);
		expect(overlayColour(d, Infinity)).toBe(NOT_REACHED_COLOUR);
	});
});
