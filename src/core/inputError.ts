/**
 * The one error type for mistakes the user can cause and fix.
 *
 * Thrown by core and io, caught once in `src/cli/main.ts`, printed as a single line
 * (`describe()`), exit code 2, nothing written. Anything else that escapes is our bug
 * and keeps its stack trace.
 */

export interface InputLocation {
  file?: string;
  /** 1-based row of a table (header is row 1), as a spreadsheet shows it. */
  row?: number;
  column?: string;
  /** Dotted key path in the study file, e.g. `factors[2].low` or `design.runs`. */
  key?: string;
}

export class InputError extends Error {
  readonly location: InputLocation;

  constructor(message: string, location: InputLocation = {}) {
    super(message);
    this.name = 'InputError';
    this.location = location;
  }

  /** The same error, with the file filled in where the thrower did not know it. */
  inFile(file: string): InputError {
    if (this.location.file) return this;
    return new InputError(this.message, { ...this.location, file });
  }

  /** One line: `file, row 4, column total: message` or `file, key design.runs: message`. */
  describe(): string {
    const { file, row, column, key } = this.location;
    const parts: string[] = [];
    if (file) parts.push(file);
    if (row !== undefined) parts.push(`row ${row}`);
    // Column names and key paths may come from the user's file: a header of a thousand characters stays short here.
    if (column !== undefined) parts.push(`column ${excerpt(column)}`);
    if (key !== undefined) parts.push(`key ${excerpt(key, 120)}`);
    const line = parts.length ? `${parts.join(', ')}: ${this.message}` : this.message;
    // A file name or a key taken from the user's file may hold a line break; the message stays one line.
    return line.replace(/[\r\n\u2028\u2029]+/g, ' ');
  }
}

/**
 * User text short enough to quote in a one-line message: the first `max` characters, line
 * breaks and tabs shown as spaces, "…" where it was cut.
 */
export function excerpt(text: string, max = 60): string {
  const flat = text.replace(/[\r\n\t\u2028\u2029]+/g, ' ');
  return flat.length > max ? `${flat.slice(0, max - 1)}…` : flat;
}
