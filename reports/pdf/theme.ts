/**
 * The sheets' own palette and sizes: ink on white, one blue-green accent for our values, a burnt
 * orange for the student's, greys for structure. Meaning never rests on colour alone: severities are
 * also named in words and drawn as different shapes, and the two lines differ in dash too.
 */
export const COLOR = {
  ink: '#1c2430',
  muted: '#5b6675',
  faint: '#8a94a3',
  rule: '#c9d0d9',
  grid: '#e6eaef',
  panel: '#f3f5f8',
  accent: '#0f6e7a',
  accentLight: '#d8ecee',
  student: '#b5531b',
  studentLight: '#f6e3d6',
  error: '#a4262c',
  warning: '#8a5a00',
  info: '#3d5a80',
  band: '#e4efe0',
  bandEdge: '#7aa36a',
} as const;

export const SIZE = {
  title: 17,
  heading: 12.5,
  subheading: 10,
  body: 9,
  small: 7.8,
  tiny: 6.8,
} as const;

export const PAGE = { size: 'A4' as const, margin: 46, footer: 30 };
