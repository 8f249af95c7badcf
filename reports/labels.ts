/** Words shared by the sheets. */
export const SEVERITY_WORD = { error: 'Error', warning: 'Warning', info: 'Info' } as const;
