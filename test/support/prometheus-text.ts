/**
 * A strict reader of the Prometheus text exposition format (version 0.0.4), written from the format's
 * rules as remembered, independently of the library that writes it: `# HELP` and `# TYPE` lines, then
 * samples `name{label="value",...} value`; names `[a-zA-Z_:][a-zA-Z0-9_:]*`, label names
 * `[a-zA-Z_][a-zA-Z0-9_]*`, label values with `\\`, `\"` and `\n` escaped; values floats, `NaN`,
 * `+Inf`, `-Inf` (in any case, as Prometheus's own reader takes them). A histogram's `_bucket`
 * samples carry `le`, are cumulative, and end at `+Inf` with the family's `_count`. Throws naming the
 * line that breaks a rule.
 */
export interface Sample {
  name: string;
  labels: Record<string, string>;
  value: number;
}

export interface Family {
  name: string;
  type: 'counter' | 'gauge' | 'histogram' | 'summary' | 'untyped';
  help?: string;
  samples: Sample[];
}

const NAME = /^[a-zA-Z_:][a-zA-Z0-9_:]*$/;
const SAMPLE = /^([a-zA-Z_:][a-zA-Z0-9_:]*)(?:\{(.*)\})? (\S+)(?: (-?\d+))?$/;
const LABEL = /^([a-zA-Z_][a-zA-Z0-9_]*)="((?:[^"\\\n]|\\[\\"n])*)"(?:,|$)/;
const TYPES = new Set(['counter', 'gauge', 'histogram', 'summary', 'untyped']);
const SUFFIXES: Record<Family['type'], string[]> = {
  counter: [''],
  gauge: [''],
  untyped: [''],
  histogram: ['_bucket', '_sum', '_count'],
  summary: ['', '_sum', '_count'],
};

function parseValue(text: string, line: string): number {
  const word = text.toLowerCase();
  if (word === '+inf') return Infinity;
  if (word === '-inf') return -Infinity;
  if (word === 'nan') return NaN;
  if (!/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(text)) throw new Error(`not a sample value: ${line}`);
  return Number(text);
}

function parseLabels(text: string, line: string): Record<string, string> {
  const labels: Record<string, string> = {};
  let rest = text;
  while (rest.length > 0) {
    const m = LABEL.exec(rest);
    if (!m) throw new Error(`bad labels: ${line}`);
    if (m[1] in labels) throw new Error(`label ${m[1]} twice: ${line}`);
    labels[m[1]] = m[2].replace(/\\(.)/g, (_, c: string) => (c === 'n' ? '\n' : c));
    rest = rest.slice(m[0].length);
  }
  return labels;
}

export function parsePrometheusText(text: string): Map<string, Family> {
  const families = new Map<string, Family>();
  const typed = new Set<string>();
  if (!text.endsWith('\n')) throw new Error('the exposition does not end with a line feed');
  for (const line of text.slice(0, -1).split('\n')) {
    if (line === '') continue;
    const comment = /^# (HELP|TYPE) (\S+) ?(.*)$/.exec(line);
    if (comment) {
      const [, kind, name, rest] = comment;
      if (!NAME.test(name)) throw new Error(`bad metric name: ${line}`);
      const family = families.get(name) ?? { name, type: 'untyped' as const, samples: [] };
      if (kind === 'TYPE') {
        if (!TYPES.has(rest)) throw new Error(`unknown type: ${line}`);
        if (family.samples.length > 0 || typed.has(name)) throw new Error(`TYPE after samples or twice: ${line}`);
        typed.add(name);
        family.type = rest as Family['type'];
      } else {
        family.help = rest;
      }
      families.set(name, family);
      continue;
    }
    if (line.startsWith('#')) continue;
    const m = SAMPLE.exec(line);
    if (!m) throw new Error(`not a sample line: ${line}`);
    const [, name, labelText, valueText] = m;
    const family = [...families.values()].find((f) => SUFFIXES[f.type].some((s) => name === f.name + s));
    if (!family) throw new Error(`a sample of no declared family: ${line}`);
    family.samples.push({ name, labels: parseLabels(labelText ?? '', line), value: parseValue(valueText, line) });
  }
  for (const family of families.values()) if (family.type === 'histogram') checkHistogram(family);
  return families;
}

/** Each series of a histogram: buckets cumulative, the last `+Inf`, equal to its `_count`. */
function checkHistogram(family: Family): void {
  const series = new Map<string, Sample[]>();
  const key = (labels: Record<string, string>) => JSON.stringify(Object.entries(labels).filter(([k]) => k !== 'le').sort());
  for (const s of family.samples) if (s.name.endsWith('_bucket')) {
    if (s.labels.le === undefined) throw new Error(`${family.name}: a bucket without le`);
    series.set(key(s.labels), [...(series.get(key(s.labels)) ?? []), s]);
  }
  for (const [labels, buckets] of series) {
    const bounds = buckets.map((b) => parseValue(b.labels.le, b.labels.le));
    if (bounds.at(-1) !== Infinity) throw new Error(`${family.name} ${labels}: the last bucket is not +Inf`);
    for (let i = 1; i < buckets.length; i++) {
      if (!(bounds[i] > bounds[i - 1]) || buckets[i].value < buckets[i - 1].value) throw new Error(`${family.name} ${labels}: buckets not cumulative`);
    }
    const count = family.samples.find((s) => s.name === `${family.name}_count` && key(s.labels) === labels);
    if (count?.value !== buckets.at(-1)!.value) throw new Error(`${family.name} ${labels}: _count is not the +Inf bucket`);
  }
}

/** The samples of a family whose labels include the given ones. */
export function samplesOf(families: Map<string, Family>, name: string, labels: Record<string, string> = {}): Sample[] {
  const family = [...families.values()].find((f) => name === f.name || SUFFIXES[f.type].some((s) => s && name === f.name + s));
  return (family?.samples ?? []).filter((s) => s.name === name && Object.entries(labels).every(([k, v]) => s.labels[k] === v));
}
