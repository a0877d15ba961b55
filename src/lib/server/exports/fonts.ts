import { existsSync } from 'node:fs';
import { join } from 'node:path';

// The PDF fonts ship in static/fonts; after `vite build` they are also under build/client/fonts.
const dirs = [join(process.cwd(), 'static', 'fonts'), join(process.cwd(), 'build', 'client', 'fonts')];

export const pdfFonts = { text: 'Inter-Regular.otf', bold: 'Inter-SemiBold.otf', mono: 'JetBrainsMono-Regular.ttf' } as const;

export function fontFile(name: string): string {
	const dir = dirs.find((d) => existsSync(join(d, name)));
	if (!dir) throw new Error(`font ${name} not found in ${dirs.join(' or ')}`);
	return join(dir, name);
}
