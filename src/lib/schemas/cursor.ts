// A paging cursor is opaque to callers: base64url of a JSON array of strings (the last row's sort
// key and id, with what the list was sorted by). Isomorphic: the page and the server read it alike.

const toBase64url = (bytes: Uint8Array) =>
	btoa(String.fromCharCode(...bytes))
		.replace(/\+/g, '-')
		.replace(/\//g, '_')
		.replace(/=+$/, '');

/** The cursor of a row: its parts, in the order the list reads them back. */
export function encodeCursor(parts: readonly string[]): string {
	return toBase64url(new TextEncoder().encode(JSON.stringify(parts)));
}

/** The parts of a cursor this code wrote, or null for anything else (wrong alphabet, not JSON, wrong count). */
export function decodeCursor(text: string, count: number): string[] | null {
	if (!/^[A-Za-z0-9_-]+$/.test(text)) return null;
	try {
		const binary = atob(text.replace(/-/g, '+').replace(/_/g, '/'));
		const json = new TextDecoder('utf-8', { fatal: true }).decode(Uint8Array.from(binary, (c) => c.charCodeAt(0)));
		const parts: unknown = JSON.parse(json);
		if (!Array.isArray(parts) || parts.length !== count || !parts.every((p) => typeof p === 'string')) return null;
		return parts as string[];
	} catch {
		return null;
	}
}
