#!/usr/bin/env node
// Runs the compiled command in dist/ (npm ci builds it; `npm run build` after a change to the sources).
import { readFile } from 'node:fs/promises';

let cli;
try {
  cli = await import('../dist/server/cli.js');
} catch (error) {
  if (error?.code !== 'ERR_MODULE_NOT_FOUND' || !String(error.message).includes('dist/server/cli.js')) throw error;
  process.stderr.write('rateproof: the compiled build is missing: run `npm run build` (npm ci runs it)\n');
  process.exit(1);
}
process.exitCode = await cli.run(process.argv.slice(2), {
  stdout: (text) => process.stdout.write(text),
  stderr: (text) => process.stderr.write(text),
  stderrIsTerminal: process.stderr.isTTY === true,
  readFile: (path) => readFile(path, 'utf8'),
});
