import { json } from '@sveltejs/kit';
import { healthReport } from '$lib/server/health';

export async function GET() {
	const { status, body } = await healthReport();
	return json(body, { status, headers: { 'cache-control': 'no-store' } });
}
