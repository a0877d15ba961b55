import type { Handle } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { parseTheme, themeCookie } from '$lib/theme';
import { authHandle } from './auth';

/**
 * Reads the theme choice from its cookie and writes it into <html data-theme>, so the first paint
 * already has the right colours (no flash of the wrong theme).
 */
export const themeHandle: Handle = async ({ event, resolve }) => {
	const theme = parseTheme(event.cookies.get(themeCookie));
	event.locals.theme = theme;
	return resolve(event, {
		transformPageChunk: ({ html }) => html.replace('%pw.theme%', theme)
	});
};

// Auth.js first: it answers its own routes under /auth and gives every request locals.auth().
export const handle: Handle = sequence(authHandle, themeHandle);
