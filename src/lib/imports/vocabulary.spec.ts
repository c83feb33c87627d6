import { describe, expect, it } from 'vitest';
import { parseCorrections, parseMethod } from './vocabulary';

describe('method and correction spellings (common practice, no source)', () => {
	it('maps common method spellings to the stored enum', () => {
		expect(parseMethod('Bullard')).toBe('bullard');
		expect(parseMethod('interval')).toBe('borehole_interval');
		expect(parseMethod('borehole_interval')).toBe('borehole_interval');
		expect(parseMethod('BHT')).toBe('bottom_hole_temperature');
		expect(parseMethod('Bottom-hole temperature')).toBe('bottom_hole_temperature');
		expect(parseMethod('probe')).toBe('marine_probe');
		expect(parseMethod('Marine')).toBe('marine_probe');
		expect(parseMethod('guess')).toBeNull();
	});
	it('splits corrections and reports unknown parts', () => {
		expect(parseCorrections('topo, palaeo')).toEqual({
			corrections: ['topographic', 'palaeoclimatic'],
			unknown: []
		});
		expect(parseCorrections('Paleoclimatic + Topographic')).toEqual({
			corrections: ['topographic', 'palaeoclimatic'],
			unknown: []
		});
		expect(parseCorrections('none')).toEqual({ corrections: [], unknown: [] });
		expect(parseCorrections('sed; magic')).toEqual({
			corrections: ['sedimentation'],
			unknown: ['magic']
		});
	});
});
