/**
 * The API reference page's view of the OpenAPI document: operations with their parameters and
 * answers, and each named schema with its fields. Pure, so it is tested without a server.
 */

type Json = Record<string, unknown>;

export interface ReferenceField {
	name: string;
	type: string;
	required: boolean;
	description: string;
}

export interface ReferenceOperation {
	id: string;
	method: string;
	path: string;
	summary: string;
	tag: string;
	parameters: (ReferenceField & { in: string })[];
	requestBody: string | null;
	responses: { status: string; description: string; schemas: string[] }[];
}

export interface ReferenceSchema {
	name: string;
	description: string;
	fields: ReferenceField[];
}

const asJson = (v: unknown): Json => (v && typeof v === 'object' ? (v as Json) : {});

/** A short type for a JSON schema: a named schema, `array of X`, an enum, `X or null`. */
export function typeOf(schemaValue: unknown): string {
	const s = asJson(schemaValue);
	if (typeof s.$ref === 'string') return s.$ref.split('/').at(-1)!;
	if (Array.isArray(s.enum)) return s.enum.map((v) => JSON.stringify(v)).join(' | ');
	if ('const' in s) return JSON.stringify(s.const);
	if (Array.isArray(s.anyOf)) return s.anyOf.map(typeOf).join(' or ');
	if (Array.isArray(s.oneOf)) return s.oneOf.map(typeOf).join(' or ');
	const type = Array.isArray(s.type) ? s.type.join(' or ') : String(s.type ?? 'any');
	if (type === 'array') return `array of ${typeOf(s.items)}`;
	const range = [
		typeof s.minimum === 'number' ? `≥ ${s.minimum}` : '',
		typeof s.exclusiveMinimum === 'number' ? `> ${s.exclusiveMinimum}` : '',
		typeof s.maximum === 'number' ? `≤ ${s.maximum}` : ''
	].filter(Boolean);
	const format = typeof s.format === 'string' ? ` (${s.format})` : '';
	return `${type}${format}${range.length ? ` ${range.join(', ')}` : ''}`;
}

function fields(schemaValue: unknown): ReferenceField[] {
	const s = asJson(schemaValue);
	const required = Array.isArray(s.required) ? (s.required as string[]) : [];
	return Object.entries(asJson(s.properties)).map(([name, p]) => ({
		name,
		type: typeOf(p),
		required: required.includes(name),
		description: String(asJson(p).description ?? '')
	}));
}

export function buildReference(docValue: unknown): {
	title: string;
	description: string;
	server: string;
	operations: ReferenceOperation[];
	schemas: ReferenceSchema[];
} {
	const doc = asJson(docValue);
	const info = asJson(doc.info);
	const server = String(asJson((doc.servers as unknown[] | undefined)?.[0]).url ?? '');
	const operations: ReferenceOperation[] = [];
	for (const [path, item] of Object.entries(asJson(doc.paths))) {
		for (const [method, opValue] of Object.entries(asJson(item))) {
			const op = asJson(opValue);
			const body = asJson(asJson(asJson(op.requestBody).content)['application/json']).schema;
			operations.push({
				id: `${method}-${path}`.replace(/[^a-z0-9]+/gi, '-'),
				method: method.toUpperCase(),
				path: server + path,
				summary: String(op.summary ?? ''),
				tag: String((op.tags as string[] | undefined)?.[0] ?? path.split('/')[1]),
				parameters: ((op.parameters as unknown[]) ?? []).map((pv) => {
					const p = asJson(pv);
					return {
						name: String(p.name),
						in: String(p.in),
						type: typeOf(p.schema),
						required: p.required === true,
						description: String(p.description ?? asJson(p.schema).description ?? '')
					};
				}),
				requestBody: body === undefined ? null : typeOf(body),
				responses: Object.entries(asJson(op.responses)).map(([status, rv]) => {
					const r = asJson(rv);
					return {
						status,
						description: String(r.description ?? ''),
						schemas: Object.entries(asJson(r.content)).map(
							([type, c]) => `${typeOf(asJson(c).schema)} (${type})`
						)
					};
				})
			});
		}
	}
	const schemas = Object.entries(asJson(asJson(doc.components).schemas)).map(([name, s]) => ({
		name,
		description: String(asJson(s).description ?? ''),
		fields: fields(s)
	}));
	return {
		title: String(info.title ?? ''),
		description: String(info.description ?? ''),
		server,
		operations,
		schemas
	};
}
