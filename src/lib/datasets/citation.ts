/**
 * THE citation of a dataset version: who (authors, or the organisation), year of publication,
 * title, version, licence (SPDX identifier) and address. Shown on the dataset page and written
 * into every download, so it is built here and nowhere else.
 */

export interface CitableDataset {
	id: string;
	title: string;
	authors: string;
	version: number;
	licence: string;
	doi: string | null;
	status: string;
	/** The user's own note to add when citing (free text), may be empty. */
	citation: string;
	publishedAt: Date | string | null;
	createdAt: Date | string;
}

/** What travels with a download: the citation and the facts it is made of. */
export interface CitationFields {
	citation: string;
	title: string;
	authors: string;
	organisation: string;
	year: string;
	version: number;
	licence: string;
	url: string;
	doi: string | null;
	note: string | null;
}

/** The dataset page's address (the address the citation names). */
export function datasetUrl(origin: string, id: string): string {
	return `${origin.replace(/\/$/, '')}/datasets/${id}`;
}

/** Year of publication, or "unpublished" for a version not yet published. */
export function citationYear(d: CitableDataset): string {
	if (d.status !== 'published' && d.status !== 'retired') return 'unpublished';
	return String(new Date(d.publishedAt ?? d.createdAt).getUTCFullYear());
}

export function citationFields(
	d: CitableDataset,
	organisationName: string,
	origin: string
): CitationFields {
	const authors = d.authors.trim() || organisationName;
	const year = citationYear(d);
	const url = datasetUrl(origin, d.id);
	const doi = d.doi ? `https://doi.org/${d.doi}` : null;
	const citation =
		`${authors} (${year}). ${d.title}, version ${d.version} [data set]. ` +
		`${organisationName}, Thermalith. Licence ${d.licence}. ${doi ?? url}`;
	return {
		citation,
		title: d.title,
		authors,
		organisation: organisationName,
		year,
		version: d.version,
		licence: d.licence,
		url,
		doi,
		note: d.citation.trim() || null
	};
}

/** The `#` header lines of a CSV download (csv/write.ts writes them). */
export function citationComments(c: CitationFields): string[] {
	return [
		`Cite as: ${c.citation}`,
		`Licence (SPDX): ${c.licence}`,
		`Version: ${c.version}`,
		`Dataset: ${c.url}`,
		...(c.note ? [`Citation note: ${c.note}`] : [])
	];
}
