/** What a command may do to the outside world; bin/rateproof.js wires it to the process, tests to fakes. */
export interface CliIo {
  /** Receives whole lines, newline included. */
  stdout(text: string): void;
  stderr(text: string): void;
  /** Standard error is a terminal: long work shows a progress line there. */
  stderrIsTerminal?: boolean;
  readFile(path: string): Promise<string>;
  /** Writes a file, making its folder; the file system when absent. */
  writeFile?(path: string, data: string | Buffer | Uint8Array): Promise<void>;
}
