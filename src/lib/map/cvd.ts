/**
 * Colour-vision deficiency simulation, to check the heat-flow scale (heat-flow-scale.spec.ts):
 * the full-severity protanopia, deuteranopia and tritanopia matrices of Machado, Oliveira &
 * Fernandes (2009, IEEE TVCG 15(6), from memory), applied to linear sRGB; differences as
 * CIE 1976 ΔE*ab in CIELAB (D65). Own code because it is a dozen lines of published science.
 */

type Matrix = [number, number, number][];

export const CVD_MATRICES: Record<'protanopia' | 'deuteranopia' | 'tritanopia', Matrix> = {
	protanopia: [
		[0.152286, 1.052583, -0.204868],
		[0.114503, 0.786281, 0.099216],
		[-0.003882, -0.048116, 1.051998]
	],
	deuteranopia: [
		[0.367322, 0.860646, -0.227968],
		[0.280085, 0.672501, 0.047413],
		[-0.01182, 0.04294, 0.968881]
	],
	tritanopia: [
		[1.255528, -0.076749, -0.178779],
		[-0.078411, 0.930809, 0.147602],
		[0.004733, 0.691367, 0.3039]
	]
};

const toLinear = (c: number) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4);

/** Linear sRGB (0–1) of a #rrggbb colour. */
export function linearRgb(hex: string): [number, number, number] {
	const v = [1, 3, 5].map((i) => toLinear(parseInt(hex.slice(i, i + 2), 16) / 255));
	return [v[0], v[1], v[2]];
}

/** CIELAB (D65) of linear sRGB. */
export function lab([r, g, b]: [number, number, number]): [number, number, number] {
	const x = (0.4124 * r + 0.3576 * g + 0.1805 * b) / 0.95047;
	const y = 0.2126 * r + 0.7152 * g + 0.0722 * b;
	const z = (0.0193 * r + 0.1192 * g + 0.9505 * b) / 1.08883;
	const f = (t: number) => (t > 0.008856 ? Math.cbrt(t) : 7.787 * t + 16 / 116);
	return [116 * f(y) - 16, 500 * (f(x) - f(y)), 200 * (f(y) - f(z))];
}

/** Linear sRGB as a person with the deficiency sees it (clamped to the gamut). */
export function simulate(rgb: [number, number, number], m: Matrix): [number, number, number] {
	const out = m.map((row) =>
		Math.min(1, Math.max(0, row[0] * rgb[0] + row[1] * rgb[1] + row[2] * rgb[2]))
	);
	return [out[0], out[1], out[2]];
}

/** ΔE*ab (CIE 1976) between two colours as seen with matrix m (or with normal vision). */
export function deltaE(a: string, b: string, m?: Matrix): number {
	const see = (h: string) => lab(m ? simulate(linearRgb(h), m) : linearRgb(h));
	const [p, q] = [see(a), see(b)];
	return Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]);
}
