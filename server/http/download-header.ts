/**
 * `Content-Disposition: attachment` for a document (RFC 6266): `filename=` with the ASCII name, and
 * `filename*=UTF-8''…` with the name in full where it has letters outside ASCII. The names are made
 * of letters, digits, `.`, `_` and `-` only, so neither needs quoting beyond the quotes.
 */
export function attachment(name: { ascii: string; unicode: string }): { 'content-disposition': string } {
  const plain = `attachment; filename="${name.ascii}"`;
  if (name.unicode === name.ascii) return { 'content-disposition': plain };
  // RFC 5987 attr-chars: encodeURIComponent leaves ! ' ( ) * unescaped, which are not among them, but names never hold them.
  return { 'content-disposition': `${plain}; filename*=UTF-8''${encodeURIComponent(name.unicode)}` };
}
