import { error } from '@sveltejs/kit';
import { and, eq } from 'drizzle-orm';
import { formatLength } from '$lib/trade/units';
import type { Database, Queryable } from './db';
import { cuttingPackage, type FlatParams } from './db/schema';
import { logActivity } from './activity';
import { getDesign, revisionOf } from './designs';
import { sendMail } from './mail';
import { queueMail } from './mail-queue';
import { cuttingPackageCopyMessage, cuttingPackageMessage, type CuttingOrder } from './messages';
import { linkTo } from './origin';
import { wheelDxf } from './exports/dxf';
import { cuttingSpecPdf } from './exports/cutting-spec-pdf';
import { exportName } from './exports/names';
import { checkWheel, type CheckedWheel } from './wheel-request';

// A cutting package: the DXF of one revision and its shop drawing, e-mailed to a fabricator, with a
// copy to the sender. The mail goes first; the package and the log entry are recorded only once
// it has been accepted. The drawing can be previewed before sending, and downloaded again after.

type Wheel = Extract<CheckedWheel, { ok: true }>;

/** What the drawing and the DXF are made from. */
export interface DrawingOrder {
	build: { id: string; name: string };
	design: { id: string; name: string };
	revision: number;
	wheel: Wheel;
	quantity: number;
	notes: string;
	finish: string;
	/** The day the package is (or was) sent, YYYY-MM-DD. */
	date?: string;
}

export interface PackageOrder extends DrawingOrder {
	to: string;
	sender: { id: string; email: string };
}

export const revisionFileName = (name: string, revision: number) => name.replace(/\.(\w+)$/, `-r${revision}.$1`);

/** The design of this build and its revision, checked as the wheel tool checks it; 404 / 422 naming the field otherwise. */
export async function revisionToCut(database: Queryable, buildId: string, designId: string, number?: number) {
	const design = await getDesign(database, designId);
	if (!design || design.buildId !== buildId) error(404, { message: 'designId: no such wheel design in this build', code: 'not-found' });
	const revision = await revisionOf(database, design.id, number);
	if (!revision) error(404, { message: `revision: “${design.name}” has no revision ${number}`, code: 'not-found' });
	const wheel = checkWheel(revision.params);
	if (!wheel.ok)
		error(422, {
			message: `Revision ${revision.number} no longer passes the wheel checks: ${Object.values(wheel.errors).join('; ')}`,
			code: 'invalid'
		});
	return { design, revision: revision.number, wheel };
}

/** The DXF and the shop drawing of an order, with their file names. */
export async function packageFiles(order: DrawingOrder) {
	const { spec, units, paper } = order.wheel.wheel;
	const dxfName = revisionFileName(exportName(spec, units, 'dxf'), order.revision);
	const specName = revisionFileName(exportName(spec, units, 'pdf').replace(/^wheel-/, 'cutting-spec-'), order.revision);
	const pdf = await cuttingSpecPdf({
		buildName: order.build.name,
		designName: order.design.name,
		revision: order.revision,
		quantity: order.quantity,
		notes: order.notes,
		finish: order.finish,
		dxfName,
		date: order.date ?? new Date().toISOString().slice(0, 10),
		spec,
		summary: order.wheel.summary,
		units,
		paper
	});
	return { dxfName, specName, pdf, dxf: Buffer.from(wheelDxf(spec, units)) };
}

export async function sendCuttingPackage(database: Database, order: PackageOrder) {
	const { spec, units } = order.wheel.wheel;
	const files = await packageFiles(order);
	const thickness = formatLength(spec.thicknessMm, units);
	const message: CuttingOrder = {
		to: order.to,
		from: order.sender.email,
		buildName: order.build.name,
		designName: order.design.name,
		revision: order.revision,
		quantity: order.quantity,
		material: spec.materialLabel,
		thickness,
		notes: order.notes,
		finish: order.finish,
		attachments: [
			{ filename: files.dxfName, content: files.dxf, contentType: 'application/dxf' },
			{ filename: files.specName, content: files.pdf, contentType: 'application/pdf' }
		]
	};
	const messageId = await sendMail(cuttingPackageMessage(message));
	const details: FlatParams = {
		quantity: String(order.quantity),
		material: spec.materialLabel,
		thickness,
		notes: order.notes,
		...(order.finish ? { finish: order.finish } : {}),
		dxf: files.dxfName,
		spec: files.specName
	};
	const recorded = await database.transaction(async (tx) => {
		const [row] = await tx
			.insert(cuttingPackage)
			.values({
				buildId: order.build.id,
				designId: order.design.id,
				revision: order.revision,
				sentTo: order.to,
				details,
				messageId,
				sentBy: order.sender.id
			})
			.returning({ id: cuttingPackage.id, createdAt: cuttingPackage.createdAt });
		await logActivity(tx, {
			buildId: order.build.id,
			actorId: order.sender.id,
			kind: 'cutting-package',
			summary: `Cutting package for “${order.design.name}” revision ${order.revision} (${order.quantity} off) sent to ${order.to}`
		});
		return { id: row!.id, messageId, files: [files.dxfName, files.specName] };
	});
	// The sender's copy rides on this request's count in the mail throttle (it goes only to the
	// signed-in sender's own address), after the answer: a copy that fails leaves the order sent.
	queueMail(() => sendMail(cuttingPackageCopyMessage(message, { to: order.sender.email, buildUrl: linkTo(`/builds/${order.build.id}`) })));
	return recorded;
}

/** A package sent from this build, or undefined (another build's id and a made-up one alike). */
export async function getCuttingPackage(database: Queryable, buildId: string, packageId: string) {
	const [row] = await database
		.select()
		.from(cuttingPackage)
		.where(and(eq(cuttingPackage.id, packageId), eq(cuttingPackage.buildId, buildId)));
	return row;
}
