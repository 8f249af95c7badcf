/** Stored with every result, so a grade can be traced to the rules that produced it. */
export const ENGINE_VERSION = '0.2.0';
