/** Browser helpers of the upload wizard: hashing the file and talking to the import API. */
export async function sha256Hex(bytes: ArrayBuffer): Promise<string> {
	const digest = await crypto.subtle.digest('SHA-256', bytes);
	return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, '0')).join('');
}

export async function postJson<T>(url: string, body: unknown): Promise<T> {
	const res = await fetch(url, {
		method: 'POST',
		headers: { 'content-type': 'application/json' },
		body: JSON.stringify(body)
	});
	const data = await res.json().catch(() => ({ message: `${res.status} ${res.statusText}` }));
	if (!res.ok)
		throw Object.assign(new Error(data.message ?? 'request failed'), { status: res.status });
	return data as T;
}

export interface PreviewResponse {
	errorCount: number;
	warningCount: number;
	validCount: number;
	totalRows: number;
	canImport: boolean;
	ignoredColumns: string[];
	issues: { row: number | null; severity: 'error' | 'warning'; column: string; message: string }[];
	issuesTruncated: boolean;
	rows: {
		row: number;
		ok: boolean;
		errors: number;
		warnings: number;
		site: Record<string, unknown>;
	}[];
	reportCsv: string;
	previousImport: { at: string; rows: number } | null;
}

export interface BatchStatus {
	status: 'running' | 'done' | 'failed';
	totalRows: number;
	doneRows: number;
	error: string | null;
}

/** Poll an import until it finishes, reporting progress. */
export async function followImport(
	batchId: string,
	onProgress: (s: BatchStatus) => void
): Promise<BatchStatus> {
	for (;;) {
		const res = await fetch(`/api/v1/imports/${batchId}`);
		const status = (await res.json()) as BatchStatus;
		onProgress(status);
		if (status.status !== 'running') return status;
		await new Promise((r) => setTimeout(r, 400));
	}
}
