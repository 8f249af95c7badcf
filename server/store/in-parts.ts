/** `items` cut into consecutive parts of at most `size`, in order. */
export function inParts<T>(items: readonly T[], size: number): T[][] {
  return Array.from({ length: Math.ceil(items.length / size) }, (_, i) => items.slice(i * size, (i + 1) * size));
}
