import { json } from '@sveltejs/kit';
import { healthReport } from '$lib/server/health';
import { retryAfterS } from '$lib/server/unavailable';

export async function GET() {
	const { status, body } = await healthReport();
	const headers: Record<string, string> = { 'cache-control': 'no-store' };
	if (status === 503) headers['retry-after'] = String(retryAfterS);
	return json(body, { status, headers });
}
