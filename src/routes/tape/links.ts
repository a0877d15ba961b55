// The tape page's download links: one look for a file that can be made, one for a file that cannot yet.
export const disabledLink =
	'flex min-h-tap cursor-not-allowed items-center justify-center rounded-part border border-dashed border-line px-4 text-sm font-medium text-ink-muted';
export const primaryLink =
	'flex min-h-tap items-center justify-center rounded-part bg-layout px-5 font-semibold text-on-layout hover:opacity-90';
