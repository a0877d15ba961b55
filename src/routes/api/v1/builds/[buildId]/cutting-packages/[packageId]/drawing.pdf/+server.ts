import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { objectAccess } from '$lib/server/access';
import { fileResponse } from '$lib/server/api';
import { getBuild } from '$lib/server/builds';
import { getCuttingPackage, packageFiles, revisionToCut } from '$lib/server/cutting-package';
import { db } from '$lib/server/db';

function notFound(): never {
	error(404, { message: 'packageId: no such cutting package in this build', code: 'not-found' });
}

/** The shop drawing of a package already sent, drawn again from its revision and the details it was sent with. */
export async function GET(event) {
	const access = await objectAccess(event, 'read', 'build', event.params.buildId);
	if (!z.uuid().safeParse(event.params.packageId).success) notFound();
	const sent = await getCuttingPackage(db(), access.buildId, event.params.packageId);
	if (!sent) notFound();
	if (!sent.designId) error(404, { message: 'designId: the wheel design of this package was removed', code: 'not-found' });
	const { design, revision, wheel } = await revisionToCut(db(), access.buildId, sent.designId, sent.revision);
	const build = (await getBuild(db(), access.buildId))!;
	const files = await packageFiles({
		build,
		design,
		revision,
		wheel,
		quantity: Number(sent.details.quantity ?? 1) || 1,
		notes: sent.details.notes ?? '',
		finish: sent.details.finish ?? '',
		date: sent.createdAt.toISOString().slice(0, 10)
	});
	return fileResponse(files.pdf, 'application/pdf', files.specName, 'private');
}
