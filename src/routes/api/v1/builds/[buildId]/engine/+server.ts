import { json } from '@sveltejs/kit';
import { engineProfile } from '$lib/schemas/build';
import { checkPhasing } from '$lib/schemas/phasing';
import { objectAccess } from '$lib/server/access';
import { jsonBody, refuse } from '$lib/server/api';
import { updateBuild } from '$lib/server/builds';
import { db } from '$lib/server/db';
import { phasing } from '$lib/trade/phasing';

/**
 * Stores the build's engine profile and sensor set-up: the phasing check's parameters (the same
 * names as `GET /api/v1/phasing`), checked the same way. Answers the phasing result for them.
 */
export async function PUT(event) {
	const access = await objectAccess(event, 'edit', 'build', event.params.buildId);
	const body = await jsonBody(event.request, engineProfile);
	if (!body.ok) return body.response;
	const parsed = checkPhasing(body.data.params);
	if (!parsed.ok) return refuse(parsed.refusals);
	const params = Object.fromEntries(Object.entries(body.data.params).filter(([, v]) => v.trim() !== ''));
	const result = phasing(parsed.value.input);
	await updateBuild(db(), access.workshop.id, access.buildId, { engineProfile: params }, {
		actorId: access.user.id,
		kind: 'engine',
		summary: `Engine profile: ${parsed.value.layoutLabel}; first-tooth offset ${result.firstToothOffsetDeg}° BTDC`
	});
	return json({ params, layout: parsed.value.layoutLabel, phasing: result });
}
