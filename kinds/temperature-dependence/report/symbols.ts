/** The kind's quantities as the documents write them (sub/superscript markup). */
export const SYMBOLS = { Ea: 'E_{a}', A: 'A', dH: 'ΔH^{‡}', dS: 'ΔS^{‡}' } as const;
