/** The current theme's colours by CSS variable name, for drawings that must carry them (SVG, 3D). */
export function themeColour(name: string): string {
  return getComputedStyle(document.documentElement).getPropertyValue(`--${name}`).trim() || '#888888';
}
