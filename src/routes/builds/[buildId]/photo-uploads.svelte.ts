// A build's photo uploads in progress: each file goes up in its own request, so one refused file
// keeps none of the others back and its refusal shows beside it.
import { refusal, type Refusal } from '$lib/schemas/refusal';

// The server's limit (src/lib/server/photos/intake.ts); checked here only to spare a long wait.
export const maxBytes = 20 * 1024 * 1024;

export type Status = 'waiting' | 'sending' | 'checking' | 'done' | 'refused';

export interface Upload {
	key: number;
	name: string;
	total: number;
	sent: number;
	status: Status;
	message?: string;
}

export const mb = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(1)} MB`;
export const percentOf = (u: Upload) => (u.total ? Math.min(100, Math.round((100 * u.sent) / u.total)) : 100);

/** The upload's refusal, worded for beside the file (the field's name taken off). */
export function refusalOf(status: number, text: string): string {
	try {
		const body = JSON.parse(text) as { message?: string; errors?: Record<string, string>; refusals?: Refusal[] };
		const said = body.refusals?.find((r) => r.field === 'file')?.message ?? body.errors?.file ?? body.message;
		if (said) return refusal('file', said).message;
	} catch {
		// Not JSON: a proxy's or the server's own limit page.
	}
	if (status === 413) return `too large: at most ${maxBytes / 1024 / 1024} MB per photo`;
	return `the upload failed (status ${status}); try again`;
}

export class PhotoUploads {
	readonly buildId: string;
	list = $state<Upload[]>([]);
	readonly busy = $derived(this.list.some((u) => u.status === 'waiting' || u.status === 'sending' || u.status === 'checking'));
	private nextKey = 0;

	constructor(buildId: string) {
		this.buildId = buildId;
	}

	clear() {
		this.list = [];
	}

	/** One file in one request, through XMLHttpRequest: fetch cannot report upload progress. */
	private send(item: Upload, file: File): Promise<void> {
		return new Promise((resolve) => {
			const body = new FormData();
			body.append('file', file, file.name);
			const xhr = new XMLHttpRequest();
			xhr.open('POST', `/api/v1/builds/${encodeURIComponent(this.buildId)}/photos`);
			xhr.setRequestHeader('accept', 'application/json');
			xhr.upload.onprogress = (event) => {
				if (event.lengthComputable) [item.sent, item.total] = [event.loaded, event.total];
			};
			// Every byte is sent; the server now checks the photo and makes its thumbnail.
			xhr.upload.onload = () => {
				item.sent = item.total;
				item.status = 'checking';
			};
			xhr.onload = () => {
				if (xhr.status === 201) {
					item.sent = item.total;
					item.status = 'done';
				} else {
					item.status = 'refused';
					item.message = refusalOf(xhr.status, xhr.responseText);
				}
				resolve();
			};
			xhr.onerror = () => {
				item.status = 'refused';
				item.message = 'the upload did not reach the server; check the connection and try again';
				resolve();
			};
			item.status = 'sending';
			xhr.send(body);
		});
	}

	/** Sends the files one at a time (each is decoded and re-encoded on the server); how many were stored. */
	async uploadAll(files: File[]): Promise<number> {
		if (!files.length) return 0;
		// Finished rows of an earlier round make way; refused ones stay until cleared.
		this.list = this.list.filter((u) => u.status !== 'done');
		const batch = files.map((file) => {
			const item: Upload = { key: this.nextKey++, name: file.name, total: file.size, sent: 0, status: 'waiting' };
			if (file.size > maxBytes) {
				item.status = 'refused';
				item.message = `at most ${maxBytes / 1024 / 1024} MB per photo; this file is ${mb(file.size)}`;
			}
			return item;
		});
		this.list.push(...batch);
		// The proxies, so progress set inside send() shows.
		const rows = this.list.slice(-batch.length);
		let stored = 0;
		for (let i = 0; i < rows.length; i++) {
			if (rows[i]!.status !== 'waiting') continue;
			await this.send(rows[i]!, files[i]!);
			if (rows[i]!.status === 'done') stored++;
		}
		return stored;
	}
}
