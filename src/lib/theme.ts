/** The three theme choices; "system" follows the operating system's light or dark setting. */
export const themes = ['system', 'light', 'dark'] as const;
export type Theme = (typeof themes)[number];

export const themeCookie = 'pw-theme';

export function parseTheme(value: string | undefined | null): Theme {
	return themes.includes(value as Theme) ? (value as Theme) : 'system';
}

/** The choice after `current` when the switch is pressed. */
export function nextTheme(current: Theme): Theme {
	return themes[(themes.indexOf(current) + 1) % themes.length]!;
}
