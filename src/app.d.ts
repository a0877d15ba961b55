// See https://svelte.dev/docs/kit/types#app.d.ts
import type { Theme } from '$lib/theme';

declare global {
	namespace App {
		interface Error {
			message: string;
			/** A short machine-readable reason, for API clients and support. */
			code?: string;
		}
		interface Locals {
			/** The theme choice read from the `pw-theme` cookie; "system" when unset. */
			theme: Theme;
		}
		// interface PageData {}
		// interface PageState {}
		// interface Platform {}
	}
}

export {};
