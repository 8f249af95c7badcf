/**
 * Compose's variable interpolation, as the Compose Specification's "Interpolation" section defines it
 * (github.com/compose-spec/compose-spec, interpolation.md): `$VAR` and `${VAR}`; `${VAR:-default}`
 * (unset or empty: the default), `${VAR-default}` (unset: the default); `${VAR:?message}` and
 * `${VAR?message}` (unset: an error with the message); `$$` a literal `$`. Nested expressions in a
 * default are not read: the project's compose file uses none, and one here fails the test.
 */
export interface Interpolated {
  value: string;
  /** The variables read, each with whether it must be set (`:?` / `?`). */
  variables: { name: string; required: boolean }[];
}

export class MissingVariable extends Error {}

export function interpolate(text: string, env: Record<string, string | undefined>): Interpolated {
  const variables: Interpolated['variables'] = [];
  const value = text.replace(/\$\$|\$\{([^}]*)\}|\$([A-Za-z_][A-Za-z0-9_]*)/g, (whole, braced?: string, bare?: string) => {
    if (whole === '$$') return '$';
    if (bare !== undefined) {
      variables.push({ name: bare, required: false });
      return env[bare] ?? '';
    }
    const match = /^([A-Za-z_][A-Za-z0-9_]*)(?:(:?)([-?])(.*))?$/s.exec(braced!);
    if (!match || match[4]?.includes('$')) throw new Error(`an interpolation this reader does not understand: ${whole}`);
    const [, name, colon, operator, operand = ''] = match;
    const current = env[name];
    const missing = current === undefined || (colon === ':' && current === '');
    variables.push({ name, required: operator === '?' });
    if (!missing) return current;
    if (operator === '-') return operand;
    if (operator === '?') throw new MissingVariable(`${name}: ${operand}`);
    return '';
  });
  return { value, variables };
}
