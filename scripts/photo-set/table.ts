// Prints the cases table for tests/fixtures/photo-set/README.md from the truth files:
// `npx tsx scripts/photo-set/table.ts`.
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';

const dir = resolve(import.meta.dirname, '../../tests/fixtures/photo-set');
const index = JSON.parse(readFileSync(join(dir, 'index.json'), 'utf8')) as { cases: { name: string; truth: string }[] };
console.log('| image | N-M | finish | background | light | tilt° | roll° | occluder | size | fill | tips |');
console.log('|---|---|---|---|---|---|---|---|---|---|---|');
for (const c of index.cases) {
	const t = JSON.parse(readFileSync(join(dir, c.truth), 'utf8')) as Record<string, string | number | unknown[]>;
	const row = [c.name, `${t.teeth}-${t.missing}`, t.material, t.background, t.light, t.tiltDeg, t.rollDeg, t.occluder];
	console.log(`| ${row.join(' | ')} | ${t.width}x${t.height} | ${t.fill} | ${(t.tips as unknown[]).length} |`);
}
