// The pages' calls to the JSON API (README: "Builds, wheel designs …"): one answer shape whatever
// happened, so each caller only decides what to show.
import { refusal, type Refusal } from './schemas/refusal';

export type ApiBody = { message?: string; code?: string; errors?: Record<string, string>; refusals?: Refusal[]; [key: string]: unknown };
export interface ApiAnswer {
	ok: boolean;
	/** 0 when the server could not be reached. */
	status: number;
	body: ApiBody;
}

export async function callApi(
	method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE',
	path: string,
	body?: unknown,
	signal?: AbortSignal
): Promise<ApiAnswer> {
	let res: Response;
	try {
		res = await fetch(path, {
			method,
			signal,
			headers: { accept: 'application/json', ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
			body: body === undefined ? undefined : JSON.stringify(body)
		});
	} catch (err) {
		if (err instanceof DOMException && err.name === 'AbortError') throw err;
		return { ok: false, status: 0, body: { message: 'The server could not be reached: check the connection and try again.' } };
	}
	const text = await res.text();
	try {
		return { ok: res.ok, status: res.status, body: text ? (JSON.parse(text) as ApiBody) : {} };
	} catch {
		return { ok: res.ok, status: res.status, body: { message: `The server answered ${res.status} without a reason.` } };
	}
}

/**
 * A refusal split into messages for the fields shown (a tool parameter comes back as
 * `params.<name>`; a 404 names its field at the start of its message), worded for beside the
 * field, and the rest, for an alert.
 */
export function splitRefusal(
	answer: ApiAnswer,
	shown: readonly string[],
	fallback = 'Not saved'
): { errors: Record<string, string>; alerts: string[] } {
	const errors: Record<string, string> = {};
	const alerts: string[] = [];
	const refusals = answer.body.refusals ?? Object.entries(answer.body.errors ?? {}).map(([field, message]) => refusal(field, message));
	for (const { field: key, message } of refusals) {
		const field = key.replace(/^params\./, '');
		if (shown.includes(field)) errors[field] ??= message;
		else alerts.push(`${key}: ${message}`);
	}
	if (!refusals.length) {
		const message = answer.body.message ?? `${fallback} (error ${answer.status}).`;
		const named = shown.find((f) => message.startsWith(`${f}: `));
		if (named) errors[named] = refusal(named, message).message;
		else alerts.push(message);
	}
	return { errors, alerts };
}

/** A file sent as the request's whole body (a CSV to read, `text/csv`), answered like `callApi`. */
export async function postFile(path: string, file: Blob, contentType: string, signal?: AbortSignal): Promise<ApiAnswer> {
	let res: Response;
	try {
		res = await fetch(path, { method: 'POST', signal, headers: { accept: 'application/json', 'content-type': contentType }, body: file });
	} catch (err) {
		if (err instanceof DOMException && err.name === 'AbortError') throw err;
		return { ok: false, status: 0, body: { message: 'The server could not be reached: check the connection and try again.' } };
	}
	const text = await res.text();
	try {
		return { ok: res.ok, status: res.status, body: text ? (JSON.parse(text) as ApiBody) : {} };
	} catch {
		return { ok: res.ok, status: res.status, body: { message: `The server answered ${res.status} without a reason.` } };
	}
}
