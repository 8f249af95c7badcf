import { createRequire } from 'node:module';

/**
 * A distribution function's package, from the one file `npm run build` bundles it into
 * (dist/server/vendor/NAME.cjs): the same code, loaded in tens of milliseconds where the package's
 * 200-odd small modules take 300-500 ms, in the process and again in every pool worker that needs it.
 * Run from the sources (tests, development) there is no such file, and the package itself is loaded.
 */
export function loadBundled<T>(name: string, packageName: string): T {
  const require = createRequire(import.meta.url);
  try {
    return require(`../vendor/${name}.cjs`) as T;
  } catch (error) {
    if ((error as { code?: string }).code !== 'MODULE_NOT_FOUND') throw error;
    return require(packageName) as T;
  }
}
