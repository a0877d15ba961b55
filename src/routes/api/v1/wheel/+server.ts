import { json } from '@sveltejs/kit';
import { wheelFromQuery } from '$lib/server/wheel-request';

export function GET({ url }) {
	const r = wheelFromQuery(url);
	if (!r.ok) return r.response;
	return json({ units: r.wheel.units, ...r.summary });
}
