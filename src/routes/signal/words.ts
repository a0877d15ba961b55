// Numbers as the signal page prints them.

/** A number rounded to `places`, without trailing zeros. */
export const fmt = (v: number, places = 2) => (Number.isFinite(v) ? String(Number(v.toFixed(places))) : '–');

/** A fraction as a whole percent, the sign kept (a negative margin fails). */
export const pct = (fraction: number) => (Number.isFinite(fraction) ? `${Math.round(fraction * 100)}%` : '–');
