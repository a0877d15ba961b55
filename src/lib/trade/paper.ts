/** ISO 216 A4 210 x 297 mm; ANSI Letter 8.5 x 11 in. */
export const papers = { a4: { widthMm: 210, heightMm: 297 }, letter: { widthMm: 215.9, heightMm: 279.4 } } as const;
export type Paper = keyof typeof papers;
