/**
 * A Dockerfile read into its stages and instructions, enough for the checks of deployment-files.test.ts:
 * `\` continues a line, a line starting with `#` is a comment, `FROM image AS name` opens a stage,
 * instructions are case-insensitive (Dockerfile reference, docs.docker.com/reference/dockerfile/).
 * Parser directives, heredocs and escape-character changes are not read: the project's Dockerfile
 * uses none, and a line this reader does not understand fails the test rather than passing it.
 */
export interface Instruction {
  keyword: string;
  /** The words after the keyword, flags (`--from=build`) kept, an exec-form JSON array unpacked. */
  args: string[];
  /** The text after the keyword, as written. */
  text: string;
}

export interface Stage {
  name?: string;
  image: string;
  instructions: Instruction[];
}

export interface Dockerfile {
  /** ARG instructions before the first FROM, with their defaults. */
  globalArgs: Map<string, string>;
  stages: Stage[];
}

const KEYWORDS = new Set(['FROM', 'RUN', 'CMD', 'LABEL', 'EXPOSE', 'ENV', 'ADD', 'COPY', 'ENTRYPOINT', 'VOLUME', 'USER', 'WORKDIR', 'ARG', 'ONBUILD', 'STOPSIGNAL', 'HEALTHCHECK', 'SHELL']);

function logicalLines(source: string): string[] {
  const lines: string[] = [];
  let current = '';
  for (const raw of source.split('\n')) {
    if (/^\s*#/.test(raw)) continue; // comments inside a continued instruction are dropped too
    const continued = /\\\s*$/.test(raw);
    current += `${continued ? raw.replace(/\\\s*$/, '') : raw} `;
    if (continued) continue;
    if (current.trim()) lines.push(current.trim());
    current = '';
  }
  if (current.trim()) lines.push(current.trim());
  return lines;
}

function words(text: string): string[] {
  const trimmed = text.trim();
  if (trimmed.startsWith('[')) return JSON.parse(trimmed) as string[];
  return trimmed.split(/\s+/).filter(Boolean);
}

export function parseDockerfile(source: string): Dockerfile {
  const globalArgs = new Map<string, string>();
  const stages: Stage[] = [];
  for (const line of logicalLines(source)) {
    const match = /^(\S+)\s*(.*)$/.exec(line)!;
    const keyword = match[1].toUpperCase();
    if (!KEYWORDS.has(keyword)) throw new Error(`not a Dockerfile instruction: ${line}`);
    const text = match[2];
    if (keyword === 'FROM') {
      const [image, as, name] = words(text).filter((w) => !w.startsWith('--'));
      if (as !== undefined && as.toUpperCase() !== 'AS') throw new Error(`a FROM this reader does not understand: ${line}`);
      stages.push({ image: image.replace(/\$\{(\w+)\}|\$(\w+)/g, (_, a, b) => globalArgs.get(a ?? b) ?? ''), name, instructions: [] });
    } else if (stages.length === 0) {
      if (keyword !== 'ARG') throw new Error(`only ARG may come before the first FROM: ${line}`);
      const [key, value = ''] = text.split('=');
      globalArgs.set(key.trim(), value.trim());
    } else {
      const args = keyword === 'HEALTHCHECK' || keyword === 'ENV' || keyword === 'RUN' ? text.split(/\s+/) : words(text);
      stages.at(-1)!.instructions.push({ keyword, args, text });
    }
  }
  return { globalArgs, stages };
}

/** The variables of a stage's ENV instructions (the `key=value` form, values with no spaces or quotes). */
export function envOf(stage: Stage): Map<string, string> {
  const env = new Map<string, string>();
  for (const { args } of stage.instructions.filter((i) => i.keyword === 'ENV')) {
    for (const pair of args) {
      const at = pair.indexOf('=');
      if (at < 1 || /["'\s]/.test(pair)) throw new Error(`an ENV this reader does not understand: ${pair}`);
      env.set(pair.slice(0, at), pair.slice(at + 1));
    }
  }
  return env;
}

/** A COPY's sources and destination, and the stage it copies from (none: the build context). */
export function copyOf(instruction: Instruction): { from?: string; sources: string[]; destination: string } {
  const flags = instruction.args.filter((a) => a.startsWith('--'));
  const paths = instruction.args.filter((a) => !a.startsWith('--'));
  const from = flags.find((f) => f.startsWith('--from='))?.slice('--from='.length);
  return { from, sources: paths.slice(0, -1), destination: paths.at(-1)! };
}

/** The command of a HEALTHCHECK (its options before CMD left out), exec form only. */
export function healthcheckCommand(instruction: Instruction): string[] {
  const at = instruction.text.indexOf('CMD');
  if (at < 0) throw new Error(`a HEALTHCHECK without CMD: ${instruction.text}`);
  return words(instruction.text.slice(at + 'CMD'.length));
}
