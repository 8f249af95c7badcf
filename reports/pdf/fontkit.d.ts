// fontkit ships no type declarations; pdfkit only needs an object with `layout`, so the sheets keep
// the font as an opaque value.
declare module 'fontkit' {
  export interface Font {
    layout(text: string, features?: unknown): unknown;
  }
  export function create(buffer: Uint8Array, postscriptName?: string): Font;
}
