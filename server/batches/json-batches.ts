/**
 * Splits a large JSON document of submissions into batches of whole elements as it streams in, so that
 * each batch can be parsed and checked on its own (in a worker) while the file is still being read.
 * Reads a top-level array, a single object, or JSON Lines. Only the top level is read here; a malformed
 * element is found when its batch is parsed, and parseBatch names its line and column in the file.
 */

import { at, filePosition } from '../input/json-position.ts';

export interface JsonBatch {
  /** Whole elements: for an array with the commas between them, for JSON Lines one per line. */
  text: string;
  /** Line and column (1-based) where `text` starts in the file. */
  line: number;
  column: number;
}

/** A document that cannot be read: the reason, at a line and column of the file. */
export class JsonLayoutError extends Error {}

const OPEN_BRACKET = 0x5b;
const CLOSE_BRACKET = 0x5d;
const OPEN_BRACE = 0x7b;
const CLOSE_BRACE = 0x7d;
const QUOTE = 0x22;
const BACKSLASH = 0x5c;
const COMMA = 0x2c;
const NEWLINE = 0x0a;

const isSpace = (b: number) => b === 0x20 || b === NEWLINE || b === 0x0d || b === 0x09;

/** The bytes that can change depth or begin a string. */
const STRUCTURAL = new Uint8Array(256);
for (const b of [OPEN_BRACKET, CLOSE_BRACKET, OPEN_BRACE, CLOSE_BRACE, QUOTE]) STRUCTURAL[b] = 1;

/** The batch's elements, parsed; a syntax error names the file's line and column. */
export function parseBatch(batch: JsonBatch, jsonLines: boolean): unknown[] {
  if (jsonLines) {
    return batch.text.split('\n').flatMap((line, i) => {
      if (line.trim() === '') return [];
      try {
        return [JSON.parse(line) as unknown];
      } catch (error) {
        throw new JsonLayoutError(filePosition((error as Error).message, line, { line: batch.line + i, column: 1 }));
      }
    });
  }
  const text = `[${batch.text}]`;
  try {
    return JSON.parse(text) as unknown[];
  } catch (error) {
    // The bracket added in front is no part of the file: positions after it count from the batch's start.
    throw new JsonLayoutError(filePosition((error as Error).message, text, batch, 1));
  }
}

export class JsonBatcher {
  private shape: 'unknown' | 'array' | 'object' | 'lines' | 'done';
  private depth = 0;
  private inString = false;
  private escaped = false;
  /** Where the next piece starts in the file. */
  private line = 1;
  private column = 1;
  /** The batch being gathered: its bytes from earlier pieces, their size, where it starts. */
  private parts: Buffer[] = [];
  private size = 0;
  private start: { line: number; column: number } | undefined;
  private ready: JsonBatch[] = [];
  /** The batch that ended the document, kept to explain text found after it. */
  private lastBatch: JsonBatch | undefined;

  constructor(private readonly options: { jsonLines: boolean; batchBytes: number }) {
    this.shape = options.jsonLines ? 'lines' : 'unknown';
  }

  /** Feeds the next piece of the file; returns the batches it completed. */
  push(piece: Buffer): JsonBatch[] {
    if (this.shape === 'lines') this.scanLines(piece);
    else this.scan(piece);
    const ready = this.ready;
    this.ready = [];
    return ready;
  }

  /** The end of the file: the last batch, or an error if the document is unfinished. */
  end(): JsonBatch[] {
    if (this.shape === 'lines') this.close(Buffer.alloc(0));
    else if (this.shape !== 'done') throw new JsonLayoutError(`${this.shape === 'unknown' ? 'no JSON value' : 'the file ends inside the document'} ${at(this.line, this.column)}`);
    return this.ready;
  }

  private scanLines(piece: Buffer): void {
    let from = 0;
    for (let nl = piece.indexOf(NEWLINE); nl >= 0; nl = piece.indexOf(NEWLINE, nl + 1)) {
      this.start ??= { line: this.line, column: 1 };
      this.line++;
      if (this.size + nl + 1 - from >= this.options.batchBytes) {
        this.close(piece.subarray(from, nl + 1));
        from = nl + 1;
      }
    }
    if (from < piece.length) {
      this.start ??= { line: this.line, column: 1 };
      this.keep(piece.subarray(from));
    }
  }

  private scan(piece: Buffer): void {
    // Where the open batch's bytes begin in this piece (-1: no batch is open).
    let from = this.start ? 0 : -1;
    const open = (i: number) => {
      if (from < 0) {
        this.start = this.positionAt(piece, i);
        from = i;
      }
    };
    let depth = this.depth;
    for (let i = 0; i < piece.length; i++) {
      const b = piece[i];
      // Inside an element only brackets and strings matter: most bytes are digits, commas and spaces.
      if (depth >= 2 && !this.inString && STRUCTURAL[b] === 0) continue;
      if (this.inString) {
        if (this.escaped) this.escaped = false;
        else if (b === BACKSLASH) this.escaped = true;
        else if (b === QUOTE) this.inString = false;
      } else if (isSpace(b)) {
        // between values
      } else if (this.shape === 'unknown') {
        if (b === OPEN_BRACKET) this.shape = 'array';
        else if (b === OPEN_BRACE) {
          this.shape = 'object';
          open(i);
        } else this.fail(b, piece, i);
        depth = 1;
      } else if (this.shape === 'done') {
        this.fail(b, piece, i);
      } else if (b === OPEN_BRACE || b === OPEN_BRACKET) {
        open(i);
        depth++;
      } else if (b === CLOSE_BRACE || b === CLOSE_BRACKET) {
        if (--depth === 0) {
          // The array's closing bracket is not part of its last element; the single object's brace is.
          if (from >= 0) this.close(piece.subarray(from, this.shape === 'object' ? i + 1 : i), true);
          from = -1;
          this.shape = 'done';
        }
      } else if (b === COMMA && depth === 1 && this.shape === 'array') {
        if (from < 0) this.fail(b, piece, i);
        if (this.size + i - from >= this.options.batchBytes) {
          this.close(piece.subarray(from, i));
          from = -1;
        }
      } else {
        if (b === QUOTE) this.inString = true;
        open(i);
      }
    }
    this.depth = depth;
    if (from >= 0) this.keep(piece.subarray(from));
    const next = this.positionAt(piece, piece.length);
    this.line = next.line;
    this.column = next.column;
  }

  /**
   * Line and column (1-based) of byte `i` of `piece`, counted from where the piece starts; asked only
   * where a batch starts or something is wrong, so the scan itself does not count lines.
   */
  private positionAt(piece: Buffer, i: number): { line: number; column: number } {
    let line = this.line;
    let lineStart = -1;
    for (let nl = piece.indexOf(NEWLINE); nl >= 0 && nl < i; nl = piece.indexOf(NEWLINE, nl + 1)) {
      line++;
      lineStart = nl;
    }
    // Columns count characters, not UTF-8 bytes.
    const characters = piece.toString('utf8', lineStart + 1, i).length;
    return { line, column: lineStart < 0 ? this.column + characters : 1 + characters };
  }

  /**
   * A character that does not belong at the top level. A slip inside an element (a brace too many)
   * can end the document early and show only here, later: parsing the last batch names the slip's own
   * place when it can.
   */
  private fail(b: number, piece: Buffer, i: number): never {
    if (this.lastBatch) parseBatch(this.lastBatch, false);
    const { line, column } = this.positionAt(piece, i);
    throw new JsonLayoutError(`unexpected "${String.fromCharCode(b)}" ${at(line, column)}`);
  }

  private keep(bytes: Buffer): void {
    this.parts.push(bytes);
    this.size += bytes.length;
  }

  private close(last: Buffer, final = false): void {
    this.keep(last);
    const text = Buffer.concat(this.parts).toString('utf8');
    if (this.start && text.trim() !== '') this.ready.push({ text, ...this.start });
    if (final && this.start) this.lastBatch = { text, ...this.start };
    this.parts = [];
    this.size = 0;
    this.start = undefined;
  }
}
