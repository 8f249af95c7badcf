#!/usr/bin/env node
// The command is written in TypeScript; tsx compiles it as it loads, so there is no build step.
import { readFile } from 'node:fs/promises';
import { register } from 'tsx/esm/api';

register();
// Imported only after register(): a static import would be resolved before tsx is in place.
const { run } = await import('../server/cli.ts');
process.exitCode = await run(process.argv.slice(2), {
  stdout: (text) => process.stdout.write(text),
  stderr: (text) => process.stderr.write(text),
  readFile: (path) => readFile(path, 'utf8'),
});
