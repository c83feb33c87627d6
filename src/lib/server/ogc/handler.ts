import type { RequestEvent } from '@sveltejs/kit';
import { render } from 'svelte/server';
import OgcPage from './OgcPage.svelte';
import type { OgcDocument } from './documents';
import {
	HTML_TYPE,
	chooseFormat,
	contentResponse,
	errorResponse,
	etagOf,
	invalidParameter,
	type OgcError
} from './http';
import { RESOURCE_PARAMETERS, unknownRefusal, unknownParameter } from './params';

/** The base address of the API (`https://host/ogc`), for absolute links. */
export function ogcBase(url: URL): string {
	return `${url.origin}/ogc`;
}

function isError(value: OgcDocument | OgcError): value is OgcError {
	return 'status' in value;
}

function html(doc: OgcDocument): string {
	const { head, body } = render(OgcPage, { props: { view: doc.html } });
	return `<!doctype html>\n<html lang="en">\n<head>\n<meta charset="utf-8">\n${head}\n</head>\n<body>\n${body}\n</body>\n</html>\n`;
}

/**
 * A GET handler for one /ogc resource: chooses JSON or HTML, lets `build` answer with a document
 * or an error, and adds the ETag (304 on If-None-Match), caching and CORS headers. `known` lists
 * the query parameters the resource accepts; any other is a 400 (/req/core/query-param-unknown).
 */
export function ogcGet(
	build: (event: RequestEvent) => Promise<OgcDocument | OgcError>,
	known: readonly string[] = RESOURCE_PARAMETERS
) {
	return async (event: RequestEvent): Promise<Response> => {
		const unknown = unknownParameter(event.url.searchParams, known);
		if (unknown !== null) {
			const refusal = unknownRefusal(unknown, known);
			return errorResponse({
				...invalidParameter(refusal.parameter, refusal.message),
				code: 'unknown_parameter'
			});
		}
		const format = chooseFormat(event.url, event.request.headers.get('accept'));
		if (typeof format !== 'string') return errorResponse(format);
		let doc: OgcDocument | OgcError;
		try {
			doc = await build(event);
		} catch (err) {
			// Keep the one error body (and CORS) for failures too; the id links the answer to the log.
			const errorId = crypto.randomUUID();
			console.error(`[error ${errorId}] GET ${event.url.pathname}`, err);
			doc = {
				status: 500,
				code: 'internal_error',
				message: 'Something went wrong on our side.',
				details: { errorId }
			};
		}
		if (isError(doc)) return errorResponse(doc);
		if (format === 'html') {
			const page = html(doc);
			return contentResponse(event.request, page, `${HTML_TYPE}; charset=utf-8`, etagOf(page));
		}
		const { timeStamp: _generated, ...content } = doc.json;
		const body = JSON.stringify(doc.json);
		return contentResponse(event.request, body, doc.type, etagOf(JSON.stringify(content)));
	};
}
