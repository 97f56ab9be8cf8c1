/**
 * Plot colours as sRGB hex (the SVG a PDF embeds cannot read CSS variables or oklch). They match the
 * tokens of src/styles/index.css: one dark plot surface, the pickup in teal, the reference in
 * indigo (lightened on the dark surface so it keeps contrast), warnings in amber. Part markers take
 * the `parts` colours in drive order, chosen to stay apart from each other and from the teal trace.
 */
export const PLOT_COLORS = {
  surface: '#151b24',
  text: '#d9dfe5',
  mutedText: '#a3acb8',
  grid: '#323843',
  pickup: '#2ec4b6',
  pickupDim: '#0e7d74',
  reference: '#8a8ff0',
  warning: '#e8a127',
  engineBand: 'rgba(163, 172, 184, 0.16)',
  firingBand: 'rgba(232, 161, 39, 0.16)',
  event: '#f26b5b',
  parts: ['#e8a127', '#e07ac0', '#7cc46a', '#5fb3f0', '#f08a4b', '#a99cf5', '#e6d45a', '#f2a3a3'],
} as const;

/** The colour of the n-th part (drive order), cycling through the palette. */
export function partColor(index: number): string {
  return PLOT_COLORS.parts[index % PLOT_COLORS.parts.length]!;
}

/** Monospace stack for the numbers on axes and labels (the shipped JetBrains Mono first; unquoted, since echarts' SVG writes it into a style attribute as is). */
export const PLOT_MONO = 'JetBrains Mono, ui-monospace, monospace';
/** Text stack (the shipped Inter first). */
export const PLOT_SANS = 'Inter, ui-sans-serif, system-ui, sans-serif';
