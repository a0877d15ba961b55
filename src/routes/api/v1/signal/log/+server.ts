import { json } from '@sveltejs/kit';
import { refuse } from '$lib/server/api';
import { refusal } from '$lib/schemas/refusal';
import { edgeLogLimits, parseEdgeLog, readEdgeLog } from '$lib/trade/edge-log';
import { designFromQuery } from '$lib/schemas/edge-log-design';

// The edge log read against the design (docs/edge-log-format.md): the CSV as the body (text/csv
// or text/plain) or as the file field `log` of a multipart form; the design, when given, in the
// query with the wheel's own parameter names. Stores nothing, so it is open signed out.

const MiB = 1024 * 1024;
const tooLarge = () =>
	json({ message: `log: at most ${edgeLogLimits.bytes / MiB} MiB; split the log`, code: 'too-large' }, { status: 413 });
const howToSend =
	'send the CSV as the body (content-type text/csv or text/plain) or as a multipart form with the file in a field named log';

/** The log's text, or the answer that refuses it. */
async function logText(request: Request): Promise<{ ok: true; text: string } | { ok: false; response: Response }> {
	const type = (request.headers.get('content-type') ?? '').split(';')[0]!.trim().toLowerCase();
	if (type === 'multipart/form-data') {
		let form: FormData;
		try {
			form = await request.formData();
		} catch {
			return { ok: false, response: refuse([refusal('log', howToSend)]) };
		}
		const file = form.get('log');
		if (file === null) return { ok: false, response: refuse([refusal('log', 'choose a file: the form has no field named log')]) };
		if (typeof file !== 'string' && file.size > edgeLogLimits.bytes) return { ok: false, response: tooLarge() };
		return { ok: true, text: typeof file === 'string' ? file : new TextDecoder().decode(await file.arrayBuffer()) };
	}
	if (type !== 'text/csv' && type !== 'text/plain') return { ok: false, response: refuse([refusal('log', howToSend)], 415) };
	const bytes = await request.arrayBuffer();
	if (bytes.byteLength > edgeLogLimits.bytes) return { ok: false, response: tooLarge() };
	// TextDecoder drops a UTF-8 byte order mark, which spreadsheet programs put first.
	return { ok: true, text: new TextDecoder().decode(bytes) };
}

export async function POST({ request, url }) {
	const design = designFromQuery(url.searchParams);
	if (!design.ok) return refuse(design.refusals);
	const body = await logText(request);
	if (!body.ok) return body.response;
	const log = parseEdgeLog(body.text);
	if (!log.ok) return refuse(log.refusals);
	return json(readEdgeLog(log.value, design.value));
}
