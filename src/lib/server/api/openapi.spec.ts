import { Validator } from '@seriousme/openapi-schema-validator';
import { describe, expect, it } from 'vitest';
import { openApiDocument } from './openapi';

describe('the generated OpenAPI document', () => {
	it('is a valid OpenAPI 3.1 document', async () => {
		const validator = new Validator();
		const doc = openApiDocument();
		// A plain JSON copy, as a client downloads it.
		const result = await validator.validate(
			JSON.parse(JSON.stringify(doc)) as Record<string, unknown>
		);
		expect(result.errors ?? []).toEqual([]);
		expect(result.valid).toBe(true);
		expect(validator.version).toBe('3.1');
	});

	// Which paths the document names is checked against the routes on disk by the contract test
	// (tests/integration/api-contract.spec.ts); here, that every error answer has the one body.
	it('gives every error answer the one error body', () => {
		const doc = openApiDocument();
		const error = doc.components?.schemas?.Error as { properties: Record<string, unknown> };
		expect(Object.keys(error.properties)).toEqual(['error']);
		const errorAnswers: string[] = [];
		for (const [template, item] of Object.entries(doc.paths ?? {}))
			for (const [method, operation] of Object.entries(item ?? {})) {
				const responses = (operation as { responses?: Record<string, unknown> }).responses ?? {};
				for (const [status, response] of Object.entries(responses)) {
					if (Number(status) < 400) continue;
					errorAnswers.push(`${method} ${template} ${status}`);
					const schema = (response as { content?: Record<string, { schema?: { $ref?: string } }> })
						.content?.['application/json']?.schema;
					expect(schema, `${method} ${template} ${status}`).toEqual({
						$ref: '#/components/schemas/Error'
					});
				}
			}
		expect(errorAnswers.length).toBeGreaterThan(20);
	});
});
