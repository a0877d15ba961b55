import { checkCuttingDetails } from '$lib/schemas/cutting-package';
import { objectAccess } from '$lib/server/access';
import { fileResponse, refuse } from '$lib/server/api';
import { getBuild } from '$lib/server/builds';
import { packageFiles, revisionToCut } from '$lib/server/cutting-package';
import { db } from '$lib/server/db';

/**
 * The shop drawing a cutting package would carry, without sending anything: the same checks as the
 * send, read access enough. Query: designId, revision (newest when left out), quantity, finish, notes.
 */
export async function GET(event) {
	const access = await objectAccess(event, 'read', 'build', event.params.buildId);
	const checked = checkCuttingDetails(Object.fromEntries(event.url.searchParams));
	if (!checked.ok) return refuse(checked.refusals);
	const { designId, revision: number, quantity, notes, finish } = checked.value;
	const { design, revision, wheel } = await revisionToCut(db(), access.buildId, designId, number);
	const build = (await getBuild(db(), access.buildId))!;
	const files = await packageFiles({ build, design, revision, wheel, quantity, notes, finish });
	return fileResponse(files.pdf, 'application/pdf', files.specName, 'private');
}
