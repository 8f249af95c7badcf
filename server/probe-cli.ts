import { ConfigError, readConfig } from './config.ts';

// `node dist/server/probe-cli.js /health` (or `/ready`): asks the service on this machine, at the port
// the configuration names, and exits 0 on a 200, else 1 (Docker's HEALTHCHECK reserves 2). For
// container health checks, where the small images carry neither curl nor wget.
const PROBES = ['/health', '/ready'];
const TIMEOUT_MS = 3000;

/** The address to ask: this machine when the service listens on every interface. */
function probeHost(host: string): string {
  if (host === '0.0.0.0' || host === '::') return '127.0.0.1';
  return host.includes(':') ? `[${host}]` : host;
}

const path = process.argv[2] ?? '/health';
if (!PROBES.includes(path)) {
  process.stderr.write(`rateproof probe: the path is one of ${PROBES.join(', ')}, not ${path}\n`);
  process.exit(1);
}
try {
  const config = readConfig();
  const response = await fetch(`http://${probeHost(config.host)}:${config.port}${path}`, { signal: AbortSignal.timeout(TIMEOUT_MS) });
  if (response.status !== 200) process.stderr.write(`rateproof probe: ${path} answered ${response.status}: ${await response.text()}\n`);
  process.exitCode = response.status === 200 ? 0 : 1;
} catch (error) {
  // fetch names why in its cause (ECONNREFUSED ...); a timeout is a TimeoutError of its own.
  const why = (error as { cause?: { code?: string } }).cause?.code ?? (error as Error).name;
  const reason = error instanceof ConfigError ? error.message : `no answer (${why})`;
  process.stderr.write(`rateproof probe: ${path}: ${reason}\n`);
  process.exitCode = 1;
}
