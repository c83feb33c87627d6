import { describe, expect, it } from 'vitest';
import { citationComments, citationFields, type CitableDataset } from './citation';

/* The citation's parts and order (common practice for data sets, no source). */
const base: CitableDataset = {
	id: '0b9f0d3e-0000-4000-8000-000000000001',
	title: 'Invented heat flow of the Korvald shield',
	authors: '',
	version: 2,
	licence: 'CC-BY-4.0',
	doi: null,
	status: 'published',
	citation: '',
	publishedAt: '2026-11-30T12:00:00Z',
	createdAt: '2025-01-01T00:00:00Z'
};

describe('citationFields', () => {
	it('names the organisation when no authors are given, with year, version, licence, address', () => {
		const c = citationFields(base, 'Korvald Survey', 'https://thermalith.example/');
		expect(c.citation).toBe(
			'Korvald Survey (2026). Invented heat flow of the Korvald shield, version 2 [data set]. ' +
				'Korvald Survey, Thermalith. Licence CC-BY-4.0. ' +
				'https://thermalith.example/datasets/0b9f0d3e-0000-4000-8000-000000000001'
		);
	});

	it('names the authors and the DOI when given, and says when a version is unpublished', () => {
		const c = citationFields(
			{ ...base, authors: 'A. Author; B. Author', doi: '10.1234/x.1', status: 'draft' },
			'Korvald Survey',
			'http://localhost'
		);
		expect(c.citation).toMatch(/^A\. Author; B\. Author \(unpublished\)\./);
		expect(c.citation.endsWith('https://doi.org/10.1234/x.1')).toBe(true);
	});

	it('gives the CSV header lines with licence and version', () => {
		const lines = citationComments(
			citationFields({ ...base, citation: 'Also cite the paper.' }, 'K', 'http://h')
		);
		expect(lines).toEqual([
			expect.stringMatching(/^Cite as: K \(2026\)\./),
			'Licence (SPDX): CC-BY-4.0',
			'Version: 2',
			'Dataset: http://h/datasets/0b9f0d3e-0000-4000-8000-000000000001',
			'Citation note: Also cite the paper.'
		]);
	});
});
