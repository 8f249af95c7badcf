/** Words shared by the sheets. */
export const SEVERITY_WORD = { error: 'Error', warning: 'Warning', info: 'Info' } as const;

export const STAGE_TITLES = {
  readings: 'Readings',
  run: 'Runs: ln F and k_{obs}',
  'rate-law': 'Rate law: k_{N} and k_{A}',
  reporting: 'Reporting',
} as const;

export const STAGE_ORDER = ['readings', 'run', 'rate-law', 'reporting'] as const;
