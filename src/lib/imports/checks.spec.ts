// The checks added for contributors' own spreadsheets: near-duplicates by distance, non-finite
// numbers, control characters, and the contributor's corrections and exclusions.
import { describe, expect, it } from 'vitest';
import { parseNumberCell } from './cells';
import { parseCsv } from './csv';
import { applyEdits } from './edits';
import { suggestMapping } from './mapping';
import { distanceM, nearPairs } from './near-duplicates';
import { buildPreview } from './preview';

const previewOf = (csv: string, nearDistanceM?: number) => {
	const table = parseCsv(csv);
	return buildPreview(table, { mapping: suggestMapping(table.headers), nearDistanceM });
};

describe('near-duplicates by distance', () => {
	// 0.00036° of latitude ≈ 40.0 m on the mean sphere (2πR/360 = 111 195 m per degree, R = 6 371 008.8 m;
	// common practice, no source).
	it('measures great-circle distance', () => {
		expect(distanceM({ lon: 10, lat: 60 }, { lon: 10, lat: 60.00036 })).toBeCloseTo(40.03, 1);
		// One degree of longitude on the equator: 111 195 m.
		expect(distanceM({ lon: 0, lat: 0 }, { lon: 1, lat: 0 })).toBeCloseTo(111_195, -1);
	});

	it('pairs each point with its closest earlier neighbour within the distance', () => {
		const pts = [
			{ lon: 10, lat: 60 },
			{ lon: 10, lat: 60.01 }, // 1.1 km away: no pair
			{ lon: 10, lat: 60.00036 }, // 40 m from the first
			{ lon: 10.0015, lat: 60.01 } // 83 m east of the second (cos 60° halves a degree of longitude)
		];
		const pairs = nearPairs(pts, 100);
		expect(pairs.map((p) => [p.first, p.second, Math.round(p.distanceM)])).toEqual([
			[0, 2, 40],
			[1, 3, 83]
		]);
		expect(nearPairs(pts, 50).map((p) => [p.first, p.second])).toEqual([[0, 2]]);
		expect(nearPairs(pts, 0)).toEqual([]);
	});

	it('warns on the later row of a pair within the file, naming both rows and codes', () => {
		const csv = 'code;lat;lon;q\nKV-1;60,0;10,0;70\nKV-2;60,01;10,0;71\nKV-3;60,00036;10,0;72\n';
		const p = previewOf(csv);
		const near = p.issues.filter((i) => i.code === 'location.near-duplicate');
		expect(near.map((i) => i.message)).toEqual([
			'Row 4 (site KV-3) is 40 m from row 2 (site KV-1) of this file; check they are not the same borehole.'
		]);
		expect(p.rows[2].site!.flags).toEqual(['near-duplicate-in-file']);
		expect(p.rows[0].site!.flags).toEqual([]);
		expect(p.canImport).toBe(true);
		// The distance is the contributor's choice.
		expect(previewOf(csv, 30).issues.some((i) => i.code === 'location.near-duplicate')).toBe(false);
	});
});

describe('numbers that cannot be stored', () => {
	it.each(['1e999', '-1e999', 'Infinity', '-inf', 'NaN', '∞'])('refuses %s clearly', (text) => {
		const r = parseNumberCell(text, false);
		expect(r).toMatchObject({ ok: false, code: 'number.non-finite' });
	});
	it('refuses a numeric Infinity from a spreadsheet and reads 1e308', () => {
		expect(parseNumberCell(Number.POSITIVE_INFINITY, false).ok).toBe(false);
		expect(parseNumberCell('1e308', false)).toEqual({ ok: true, value: 1e308 });
	});
	it('blocks the row with a message naming row, site and column', () => {
		const p = previewOf('code,lat,lon,q\nKV-9,60,10,1e999\n');
		expect(p.errorCount).toBe(1);
		expect(p.issues[0].code).toBe('number.non-finite');
		expect(p.issues[0].message).toMatch(
			/^Row 2 \(site KV-9\), column "q": "1e999" is not a finite/
		);
		expect(p.rows[0].site).toBeNull();
	});
});

describe('control characters', () => {
	// PostgreSQL documentation, "Character Types": text cannot contain the NUL character.
	it('blocks a NUL or other control character in a mapped cell, naming it', () => {
		const p = previewOf(
			'code,name,lat,lon,q\nKV-1,Ho\u0000lm,60,10,70\nKV-2,Bell\u0007,61,10,70\n'
		);
		const errs = p.issues.filter((i) => i.code === 'text.control-character');
		expect(errs.map((e) => e.row)).toEqual([2, 3]);
		expect(errs[0].message).toBe(
			'Row 2 (site KV-1), column "name": "Ho�lm" contains the control character U+0000, which cannot be stored; remove it.'
		);
		expect(errs[1].message).toContain('U+0007');
		expect(p.canImport).toBe(false);
	});
	it('keeps tabs and line breaks in text', () => {
		const p = previewOf('code,remarks,lat,lon,q\nKV-1,"two\nlines\tand a tab",60,10,70\n');
		expect(p.errorCount).toBe(0);
	});
});

describe('corrections and exclusions', () => {
	const csv = 'code;lat;lon;q\nKV-1;60;10;70\nKV-2;;10;71\nKV-3;62;10;sixty\nKV-4;63;10;73\n';
	it('stores exactly the rows left after correcting one and excluding another', () => {
		const table = parseCsv(csv);
		const before = buildPreview(table, { mapping: suggestMapping(table.headers) });
		expect(before.errorCount).toBe(2);
		const edited = applyEdits(table, {
			corrections: [{ row: 3, column: 1, value: '61,5' }],
			excluded: [4]
		});
		expect(edited.unknown).toEqual([]);
		expect(edited.excluded).toEqual([4]);
		expect(edited.corrections).toEqual([
			{ row: 3, column: 1, value: '61,5', header: 'lat', was: '' }
		]);
		const after = buildPreview(edited.table, { mapping: suggestMapping(table.headers) });
		expect(after.canImport).toBe(true);
		expect(after.rows.map((r) => r.site?.code)).toEqual(['KV-1', 'KV-2', 'KV-4']);
		expect(after.rows[1].site!.location.lat).toBe(61.5);
		// The parsed table itself is untouched (it is kept with the batch as uploaded).
		expect(table.rows[1][1]).toBe('');
		expect(table.rows.length).toBe(4);
	});
	it('names edits of rows or columns the file does not have', () => {
		const edited = applyEdits(parseCsv(csv), {
			corrections: [{ row: 99, column: 0, value: 'x' }],
			excluded: [1]
		});
		expect(edited.unknown).toEqual([
			'row 1 to exclude is not in the file',
			'row 99, column 1 to correct is not in the file'
		]);
	});
});
