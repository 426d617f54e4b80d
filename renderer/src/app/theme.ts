export type ThemeName = 'light' | 'dark';

const KEY = 'knitbone.theme';

/** The saved theme, else the system's preference. */
export function initialTheme(): ThemeName {
  const saved = localStorage.getItem(KEY);
  if (saved === 'light' || saved === 'dark') return saved;
  return window.matchMedia?.('(prefers-color-scheme: dark)').matches ? 'dark' : 'light';
}

export function applyTheme(theme: ThemeName): void {
  document.documentElement.dataset.theme = theme;
  localStorage.setItem(KEY, theme);
}
