import { InputError, UsageError } from './cli/cli-errors.ts';
import type { CliIo } from './cli/cli-io.ts';

export type { CliIo } from './cli/cli-io.ts';

/**
 * The `rateproof` command. Process wiring (argv, streams, exit code) lives in bin/rateproof.js, so
 * everything here runs in tests against fake io. Each subcommand's module is loaded only when it runs:
 * `help` loads nothing, `check` no PDF code unless --out asks for sheets, `serve` no checker until a
 * request needs one.
 */

/** One subcommand: its arguments (after the subcommand's name) in, exit code out. */
type Command = (args: string[], io: CliIo) => Promise<number>;

const USAGE = `usage: rateproof check --assignment A.json SUBMISSIONS.(json|jsonl|csv) [--reported R.csv]
                      [--json | --jsonl [--arrays]] [--out DIR] [--signals FILE] [--workers N]
       rateproof serve
       rateproof demo

  check   grade submissions offline against an assignment's settings
          SUBMISSIONS.json holds one submission or an array of them, SUBMISSIONS.jsonl one per line;
          SUBMISSIONS.csv holds one row per reading, --reported the reported values
          --json prints the results as a JSON array instead of a table
          --jsonl prints one compact result per line, without the per-reading arrays (--arrays keeps them)
          --out DIR writes DIR/<studentId>.pdf per checked result, DIR/gradebook.csv, DIR/summary.pdf
          --signals FILE writes, as JSON, what the batch's data suggest for review (readings that look
                    alike across submissions, runs smoother than the instrument reads): prompts, not findings
          --workers N checks in N worker threads (default: one per core for files of 4 MB or more, else 0)
`;

const commands = new Map<string, () => Promise<Command>>([
  ['check', async () => (await import('./cli/check-command.ts')).checkCommand],
  ['serve', async () => serve],
  ['demo', async () => demo],
]);

/** The invented demo section, graded on the embedded database, written to ./demo-output. */
async function demo(): Promise<number> {
  const { runDemo } = await import('./demo/run-demo.ts');
  await runDemo();
  return 0;
}

/** Serves the API until stopped; configuration comes from the environment (README). */
async function serve(): Promise<number> {
  const { serve: start } = await import('./main.ts');
  await start();
  return 0;
}

/** Runs the command line `argv` (without node and the script) and returns the exit code. */
export async function run(argv: string[], io: CliIo): Promise<number> {
  const [name, ...args] = argv;
  if (name === 'help' || name === '--help' || name === '-h') {
    io.stdout(USAGE);
    return 0;
  }
  const load = name === undefined ? undefined : commands.get(name);
  if (!load) {
    io.stderr(`${name === undefined ? '' : `rateproof: unknown command "${name}"\n`}${USAGE}`);
    return 2;
  }
  try {
    return await (await load())(args, io);
  } catch (error) {
    if (error instanceof UsageError) io.stderr(`rateproof: ${error.message}\n${USAGE}`);
    else if (error instanceof InputError) io.stderr(`rateproof: ${error.message}\n`);
    else throw error;
    return 2;
  }
}
