/** A Markdown table; `|` and line breaks in cells are escaped so that a cell stays one cell. */
export function markdownTable(head: string[], rows: string[][]): string {
  const cell = (text: string) => text.replace(/\|/g, '\\|').replace(/\s*\n\s*/g, ' ');
  const line = (cells: string[]) => `| ${cells.map(cell).join(' | ')} |`;
  return [line(head), line(head.map(() => '---')), ...rows.map(line)].join('\n');
}

/** Inline code, with a fence long enough for any backticks inside. */
export function code(text: string): string {
  const fence = text.includes('`') ? '``' : '`';
  return fence === '`' ? `\`${text}\`` : `\`\` ${text} \`\``;
}
