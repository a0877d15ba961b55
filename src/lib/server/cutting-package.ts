import { formatLength } from '$lib/trade/units';
import type { Database } from './db';
import { cuttingPackage, type FlatParams } from './db/schema';
import { logActivity } from './activity';
import { sendMail } from './mail';
import { cuttingPackageMessage } from './messages';
import { wheelDxf } from './exports/dxf';
import { cuttingSpecPdf } from './exports/cutting-spec-pdf';
import { exportName } from './exports/names';
import type { CheckedWheel } from './wheel-request';

// A cutting package: the DXF of one revision and its one-page spec, e-mailed to a fabricator.
// The mail goes first; the package and the log entry are recorded only once it has been accepted.

export interface PackageOrder {
	build: { id: string; name: string };
	design: { id: string; name: string };
	revision: number;
	wheel: Extract<CheckedWheel, { ok: true }>;
	to: string;
	quantity: number;
	notes: string;
	sender: { id: string; email: string };
}

export const revisionFileName = (name: string, revision: number) => name.replace(/\.(\w+)$/, `-r${revision}.$1`);

export async function sendCuttingPackage(database: Database, order: PackageOrder) {
	const { spec, units, paper } = order.wheel.wheel;
	const dxfName = revisionFileName(exportName(spec, units, 'dxf'), order.revision);
	const specName = revisionFileName(exportName(spec, units, 'pdf').replace(/^wheel-/, 'cutting-spec-'), order.revision);
	const pdf = await cuttingSpecPdf({
		buildName: order.build.name,
		designName: order.design.name,
		revision: order.revision,
		quantity: order.quantity,
		notes: order.notes,
		dxfName,
		date: new Date().toISOString().slice(0, 10),
		spec,
		summary: order.wheel.summary,
		units,
		paper
	});
	const thickness = formatLength(spec.thicknessMm, units);
	const messageId = await sendMail(
		cuttingPackageMessage({
			to: order.to,
			from: order.sender.email,
			buildName: order.build.name,
			designName: order.design.name,
			revision: order.revision,
			quantity: order.quantity,
			material: spec.materialLabel,
			thickness,
			notes: order.notes,
			attachments: [
				{ filename: dxfName, content: Buffer.from(wheelDxf(spec, units)), contentType: 'application/dxf' },
				{ filename: specName, content: pdf, contentType: 'application/pdf' }
			]
		})
	);
	const details: FlatParams = {
		quantity: String(order.quantity),
		material: spec.materialLabel,
		thickness,
		notes: order.notes,
		dxf: dxfName,
		spec: specName
	};
	return database.transaction(async (tx) => {
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
		return { id: row!.id, messageId, files: [dxfName, specName] };
	});
}
