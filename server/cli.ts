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

/** Each subcommand's synopsis (after `usage: `) and what it does, for the usage and its --help. */
const CHECK = {
  synopsis: `rateproof check --assignment A.json SUBMISSIONS.(json|jsonl|csv) [--reported R.csv]
                      [--json | --jsonl [--arrays]] [--out DIR] [--signals FILE] [--workers N] [--quiet]`,
  text: `  check   grade submissions offline against an assignment's settings
          SUBMISSIONS.json holds one submission or an array of them, SUBMISSIONS.jsonl one per line;
          SUBMISSIONS.csv holds one row per reading, --reported the reported values
          --json prints the results as a JSON array instead of a table
          --jsonl prints one compact result per line, without the per-reading arrays (--arrays keeps them)
          --out DIR writes DIR/<studentId>.pdf per checked result, DIR/gradebook.csv, DIR/summary.pdf
          --signals FILE writes, as JSON, what the batch's data suggest for review (readings that look
                    alike across submissions, runs smoother than the instrument reads): prompts, not findings
          --workers N checks in N worker threads (default: one per core for files of 4 MB or more, else 0)
          --quiet   no progress line (shown on a terminal while a JSON file is checked)
`,
};

const SERVE = {
  synopsis: 'rateproof serve [--no-jobs | --jobs-only]',
  text: `  serve   serve the API (/v1) and the workspace (/) and work background jobs until stopped; set up by
          environment variables: DATABASE_URL (unset: embedded PostgreSQL in RATEPROOF_DATA_DIR, default
          ./data), HOST and PORT (default 127.0.0.1:3000), RATEPROOF_ADMIN_TOKEN and the others listed in
          docs/operations.md. Processes on one PostgreSQL database share the jobs (docs/jobs.md):
          --no-jobs serves requests only, --jobs-only works jobs only (both need DATABASE_URL)
`,
};

const DEMO = {
  synopsis: 'rateproof demo',
  text: `  demo    grade an invented course on an embedded database in ./demo-output, write its sheets, summary
          and gradebook there, and print an instructor token and a TA token for the workspace
`,
};

const usageOf = (command: { synopsis: string; text: string }) => `usage: ${command.synopsis}\n\n${command.text}`;

const USAGE = `usage: ${CHECK.synopsis}
       ${SERVE.synopsis}
       ${DEMO.synopsis}
       rateproof COMMAND --help

${CHECK.text}${SERVE.text}${DEMO.text}`;

/** Each subcommand, loaded when it runs, with the usage its --help prints. */
const commands = new Map<string, { usage: string; load: () => Promise<Command> }>([
  ['check', { usage: usageOf(CHECK), load: async () => (await import('./cli/check-command.ts')).checkCommand }],
  ['serve', { usage: usageOf(SERVE), load: async () => serve }],
  ['demo', { usage: usageOf(DEMO), load: async () => noArguments(demo) }],
]);

/** `demo` takes no arguments: one given is a mistake to say, not to ignore. */
function noArguments(command: () => Promise<number>): Command {
  return async (args) => {
    if (args.length > 0) throw new UsageError(`unexpected argument '${args[0]}'`);
    return command();
  };
}

/** The invented demo section, graded on the embedded database, written to ./demo-output. */
async function demo(): Promise<number> {
  const { runDemo } = await import('./demo/run-demo.ts');
  await runDemo();
  return 0;
}

/** Serves the API until stopped; configuration comes from the environment (docs/operations.md), the role from the flags. */
async function serve(args: string[]): Promise<number> {
  const { serve: start } = await import('./main.ts');
  await start(args);
  return 0;
}

const asksForHelp = (arg: string | undefined) => arg === 'help' || arg === '--help' || arg === '-h';

/** Runs the command line `argv` (without node and the script) and returns the exit code. */
export async function run(argv: string[], io: CliIo): Promise<number> {
  const [name, ...args] = argv;
  if (asksForHelp(name)) {
    io.stdout(USAGE);
    return 0;
  }
  const command = name === undefined ? undefined : commands.get(name);
  if (!command) {
    io.stderr(`${name === undefined ? '' : `rateproof: unknown command "${name}"\n`}${USAGE}`);
    return 2;
  }
  // Options end at `--`; a file named after it may be called -h.
  const options = args.includes('--') ? args.slice(0, args.indexOf('--')) : args;
  if (options.some((a) => a === '--help' || a === '-h')) {
    io.stdout(command.usage);
    return 0;
  }
  try {
    return await (await command.load())(args, io);
  } catch (error) {
    if (error instanceof UsageError) io.stderr(`rateproof: ${error.message}\n${command.usage}`);
    else if (error instanceof InputError) io.stderr(`rateproof: ${error.message}\n`);
    else throw error;
    return 2;
  }
}
