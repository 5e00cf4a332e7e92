/**
 * A capture the engine refuses, with a message a person can act on.
 * `line` is 1-based and counts every physical line of the file (preamble and header too);
 * `column` is the header as written, when one applies.
 */
export class CaptureRejection extends Error {
  readonly code: string;
  readonly line?: number;
  readonly column?: string;

  constructor(code: string, message: string, where: { line?: number; column?: string } = {}) {
    const place = [
      where.line !== undefined ? `line ${where.line}` : null,
      where.column !== undefined ? `column "${where.column}"` : null,
    ]
      .filter((part) => part !== null)
      .join(", ");
    super(place ? `${message} (${place})` : message);
    this.name = "CaptureRejection";
    this.code = code;
    if (where.line !== undefined) this.line = where.line;
    if (where.column !== undefined) this.column = where.column;
  }
}

export function isCaptureRejection(value: unknown): value is CaptureRejection {
  return value instanceof CaptureRejection;
}
