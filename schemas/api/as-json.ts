/**
 * A response body as the client reads it: the service's types hold dates, which travel as ISO 8601
 * strings in JSON.
 */
export type AsJson<T> = T extends Date ? string : T extends readonly unknown[] ? { [K in keyof T]: AsJson<T[K]> } : T extends object ? { [K in keyof T]: AsJson<T[K]> } : T;
