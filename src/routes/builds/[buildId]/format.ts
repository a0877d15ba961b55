// What the build page's sections share: dates as the server renders them, tool links, the page's classes.

const asDate = (d: string | Date) => (d instanceof Date ? d : new Date(d));

export const iso = (d: string | Date) => asDate(d).toISOString();

/** UTC, as the activity log reads, so the server's render and the browser's agree. */
export const day = (d: string | Date) => iso(d).slice(0, 10);

/** A tool's address with its saved parameters in the query (the tools read them back from there). */
export const queryOf = (params: Record<string, string>) => new URLSearchParams(params).toString();

export const numberClass = 'num whitespace-nowrap';
export const linkClass =
	'inline-flex min-h-tap items-center text-layout underline decoration-line underline-offset-4 hover:decoration-layout';
export const chipClass =
	'inline-flex min-h-tap items-center justify-center rounded-part border border-line bg-panel px-3 text-sm font-medium text-ink hover:border-layout hover:bg-sunken';
