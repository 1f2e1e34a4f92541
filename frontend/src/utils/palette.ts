// The palette of styles/palette.css for canvas drawing, which cannot read CSS
// variables. Keep the two in step.
export const PALETTE = {
  surface: '#fffdf8',
  hairline: '#e3ded3',
  ink: '#1e2326',
  inkSecondary: '#5b6368',
  primary: '#0d5c63',
  brass: '#a8741a',
  watch: '#c98a12',
} as const;
