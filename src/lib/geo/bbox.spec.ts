import { describe, expect, it } from 'vitest';
import { parseBBox, WORLD } from './bbox';

// Axis order west,south,east,north follows RFC 7946 §5 and OGC API – Features Part 1 (bbox parameter).
describe('parseBBox', () => {
	it('reads west,south,east,north', () => {
		expect(parseBBox('4.5, 57.2,11,60.25')).toEqual({
			ok: true,
			value: { west: 4.5, south: 57.2, east: 11, north: 60.25 }
		});
	});
	it('defaults to the whole world when absent', () => {
		expect(parseBBox(null)).toEqual({ ok: true, value: WORLD });
		expect(parseBBox('  ')).toEqual({ ok: true, value: WORLD });
	});
	it('clamps a zoomed-out map request to the world', () => {
		expect(parseBBox('-400,-95,400,95')).toEqual({ ok: true, value: WORLD });
	});
	it.each([
		['1,2,3', 'four numbers'],
		['1,2,x,4', 'east is not a number'],
		['1,,3,4', 'south is not a number'],
		['NaN,1,2,3', 'west is not a number'],
		['1,2,Infinity,4', 'east is not a number'],
		['10,0,5,1', 'antimeridian'],
		['0,10,1,5', 'south is north of north']
	])('refuses %s with a message naming the problem', (input, message) => {
		const result = parseBBox(input);
		expect(result.ok).toBe(false);
		if (!result.ok) expect(result.error).toContain(message);
	});
});
