import { code, markdownTable } from './markdown-table.ts';

export interface ErrorEntry {
  code: string;
  status: number;
  message: string;
}

/** Every error code the API answers with, its HTTP status and its default message, by status. */
export function errorTable(errors: ErrorEntry[]): string {
  const rows = [...errors].sort((a, b) => a.status - b.status || a.code.localeCompare(b.code)).map((e) => [code(e.code), String(e.status), e.message]);
  return markdownTable(['code', 'status', 'message'], rows);
}
