import { CaptureRejection } from "./rejection";
import { badCell, quotedNewline } from "./bad-cell";
import { quoteCell } from "./number-syntax";
import type { ColumnSink } from "./column-sink";

/** Exact powers of ten: m·10^e and m/10^e are correctly rounded for m < 2^53, |e| ≤ 22. */
const POW10 = Array.from({ length: 23 }, (_, e) => Number(`1e${e}`));
const MAX_EXACT_DIGITS = 15;
const MAX_LINE_BYTES = 1 << 20;

const NL = 10;
const CR = 13;
const SPACE = 32;
const TAB = 9;
const QUOTE = 34;

export interface BodyParser {
  push(chunk: Uint8Array): void;
  finish(): void;
}

/**
 * Byte-level parser for the numeric body. It accepts exactly the syntax of `isNumericCell`
 * and yields the same doubles as `Number()` (Clinger's exact case, else it defers to Number).
 */
export function createFastBodyParser(
  sink: ColumnSink,
  headers: readonly string[],
  delimiterText: string,
  decimal: "." | ",",
  firstLine: number,
  leadingColumns = 0,
): BodyParser {
  const delimiterByte = delimiterText.charCodeAt(0);
  const decimalCode = decimal.charCodeAt(0);
  const columnCount = headers.length;
  const rowValues = new Float64Array(columnCount);
  const decoder = new TextDecoder();
  let line = firstLine - 1;
  let carry: Uint8Array | null = null;

  const columnName = (index: number): string => headers[index] ?? `#${index + 1}`;

  function reject(buf: Uint8Array, from: number, to: number, column: number): never {
    let end = from;
    while (end < to && buf[end] !== delimiterByte && buf[end] !== NL && buf[end] !== CR) end++;
    const cell = decoder.decode(buf.subarray(from, end)).trim();
    if (from > 0 && buf[from - 1] === QUOTE && !buf.subarray(from, lineEnd(buf, from)).includes(QUOTE)) {
      throw quotedNewline(line, column < columnCount ? columnName(column) : `#${column + 1}`);
    }
    if (column >= columnCount) {
      throw new CaptureRejection("unexpected-field", `Value ${quoteCell(cell)} beyond the last column of the header`, {
        line,
        column: `#${column + 1}`,
      });
    }
    throw badCell(cell, line, columnName(column));
  }

  function lineEnd(buf: Uint8Array, from: number): number {
    let end = from;
    while (end < buf.length && buf[end] !== NL) end++;
    return end;
  }

  /** Steps over the leading metadata columns of a row; false when the row ends first. */
  function skipLeading(buf: Uint8Array, from: number): number {
    let i = from;
    let skipped = 0;
    let quoted = false;
    while (skipped < leadingColumns) {
      const c = buf[i] as number;
      if (c === NL) return -i - 1;
      if (c === QUOTE) quoted = !quoted;
      else if (c === delimiterByte && !quoted) skipped++;
      i++;
    }
    return i;
  }

  function slowValue(buf: Uint8Array, from: number, to: number): number {
    const text = decoder.decode(buf.subarray(from, to));
    return Number(decimal === "," ? text.replace(",", ".") : text);
  }

  /**
   * Parses whole lines in buf[from, to). Invariant: buf[to − 1] is a newline, so every scan stops
   * at it without a bounds check and every read stays inside the buffer.
   */
  function parseRange(buf: Uint8Array, from: number, to: number): void {
    // Locals, not closure variables: the loop below is the hottest code of an ingestion.
    const delimiter = delimiterByte;
    const decimalByte = decimalCode;
    const skipsTab = delimiter !== TAB;
    const width = columnCount;
    const row = rowValues;
    let i = from;
    while (i < to) {
      line++;
      if (leadingColumns > 0) {
        const after = skipLeading(buf, i);
        if (after < 0) {
          i = -after;
          continue;
        }
        i = after;
      }
      let column = 0;
      let filled = 0;
      for (;;) {
        let c = buf[i] as number;
        let done = false;
        if ((c >= 48 && c <= 57) || c === 45) {
          // Fast path for the common cell, "-123.4567" right up to its delimiter: at most 15
          // digits, so mantissa and 10^k are exact and one division rounds correctly. Anything
          // else (spaces, quotes, exponents, long digits) rewinds to the general path below.
          const cellStart = i;
          const negative = c === 45;
          if (negative) c = buf[++i] as number;
          let mantissa = 0;
          let whole = 0;
          let d = c - 48;
          while (d >= 0 && d <= 9) {
            mantissa = mantissa * 10 + d;
            whole++;
            c = buf[++i] as number;
            d = c - 48;
          }
          let fraction = 0;
          if (c === decimalByte) {
            c = buf[++i] as number;
            d = c - 48;
            while (d >= 0 && d <= 9) {
              mantissa = mantissa * 10 + d;
              fraction++;
              c = buf[++i] as number;
              d = c - 48;
            }
          }
          const digits = whole + fraction;
          if ((c === delimiter || c === NL || c === CR) && digits > 0 && digits <= MAX_EXACT_DIGITS && column < width) {
            const value = fraction === 0 ? mantissa : mantissa / (POW10[fraction] as number);
            row[column] = negative ? -value : value;
            filled++;
            done = true;
          } else {
            i = cellStart;
            c = buf[i] as number;
          }
        }
        if (!done) {
          while (c === SPACE || (c === TAB && skipsTab)) c = buf[++i] as number;
          const quoted = c === QUOTE;
          if (quoted) c = buf[++i] as number;
          const start = i;
          if (c === delimiter || c === NL || c === CR || (quoted && c === QUOTE)) {
            if (column < width) row[column] = Number.NaN;
            if (quoted) c = buf[++i] as number;
          } else {
            let negative = false;
            if (c === 45) {
              negative = true;
              c = buf[++i] as number;
            } else if (c === 43) {
              c = buf[++i] as number;
            }
            let mantissa = 0;
            let digits = 0;
            let exponent = 0;
            let exact = true;
            const digitsStart = i;
            // Integer part; leading zeros are not significant.
            while (c === 48) c = buf[++i] as number;
            let d = c - 48;
            while (d >= 0 && d <= 9) {
              if (digits < MAX_EXACT_DIGITS) {
                mantissa = mantissa * 10 + d;
                digits++;
              } else {
                exact = false;
              }
              c = buf[++i] as number;
              d = c - 48;
            }
            let seen = i > digitsStart;
            if (c === decimalByte) {
              c = buf[++i] as number;
              const fractionStart = i;
              if (mantissa === 0) {
                while (c === 48) {
                  exponent--;
                  c = buf[++i] as number;
                }
              }
              d = c - 48;
              while (d >= 0 && d <= 9) {
                if (digits < MAX_EXACT_DIGITS) {
                  mantissa = mantissa * 10 + d;
                  digits++;
                  exponent--;
                } else {
                  exact = false;
                }
                c = buf[++i] as number;
                d = c - 48;
              }
              seen = seen || i > fractionStart;
            }
            if (!seen) reject(buf, start, to, column);
            if (c === 101 || c === 69) {
              c = buf[++i] as number;
              let expNegative = false;
              if (c === 45) {
                expNegative = true;
                c = buf[++i] as number;
              } else if (c === 43) {
                c = buf[++i] as number;
              }
              const expStart = i;
              let expValue = 0;
              d = c - 48;
              while (d >= 0 && d <= 9) {
                if (expValue < 100000) expValue = expValue * 10 + d;
                c = buf[++i] as number;
                d = c - 48;
              }
              if (i === expStart) reject(buf, start, to, column);
              exponent += expNegative ? -expValue : expValue;
            }
            const end = i;
            if (quoted) {
              if (c !== QUOTE) reject(buf, start, to, column);
              c = buf[++i] as number;
            }
            while (c === SPACE || (c === TAB && skipsTab)) c = buf[++i] as number;
            if (c !== delimiter && c !== NL && c !== CR) reject(buf, start, to, column);
            if (column >= width) reject(buf, start, to, column);
            let value: number;
            if (!exact || exponent > 22 || exponent < -22) {
              value = slowValue(buf, start, end);
              if (!Number.isFinite(value)) reject(buf, start, to, column);
            } else {
              value = exponent >= 0 ? mantissa * (POW10[exponent] as number) : mantissa / (POW10[-exponent] as number);
              if (negative) value = -value;
            }
            row[column] = value;
            filled++;
          }
        }
        if (c === delimiter) {
          i++;
          column++;
          continue;
        }
        break;
      }
      // End of line: step over CR/LF; any other byte here was rejected above.
      while (buf[i] !== NL) i++;
      i++;
      if (filled === 0) continue;
      for (let rest = column + 1; rest < width; rest++) row[rest] = Number.NaN;
      sink.accept(row, line, filled);
    }
  }

  return {
    push(chunk: Uint8Array): void {
      let start = 0;
      if (carry) {
        const newline = chunk.indexOf(NL);
        if (newline < 0) {
          if (carry.length + chunk.length > MAX_LINE_BYTES) {
            throw new CaptureRejection("line-too-long", "A line is longer than 1 MiB: not a sample table", { line: line + 1 });
          }
          const joined = new Uint8Array(carry.length + chunk.length);
          joined.set(carry);
          joined.set(chunk, carry.length);
          carry = joined;
          return;
        }
        const joined = new Uint8Array(carry.length + newline + 1);
        joined.set(carry);
        joined.set(chunk.subarray(0, newline + 1), carry.length);
        carry = null;
        parseRange(joined, 0, joined.length);
        start = newline + 1;
      }
      const lastNewline = chunk.lastIndexOf(NL);
      if (lastNewline < start) {
        carry = chunk.slice(start);
        return;
      }
      parseRange(chunk, start, lastNewline + 1);
      if (lastNewline + 1 < chunk.length) carry = chunk.slice(lastNewline + 1);
    },
    finish(): void {
      if (carry) {
        // The last line has no newline: give it one so the scan invariant holds.
        const rest = new Uint8Array(carry.length + 1);
        rest.set(carry);
        rest[carry.length] = NL;
        carry = null;
        parseRange(rest, 0, rest.length);
      }
    },
  };
}
