import type { SniffedHeader } from "./header-sniff";

/** FNV-1a, 64 bits, over UTF-16 code units: a short stable name for a header layout (not a secret). */
function fnv1a64(text: string): string {
  let hash = 0xcbf29ce484222325n;
  const prime = 0x100000001b3n;
  const mask = (1n << 64n) - 1n;
  for (let i = 0; i < text.length; i++) hash = ((hash ^ BigInt(text.charCodeAt(i))) * prime) & mask;
  return hash.toString(16).padStart(16, "0");
}

/**
 * The identity of a header layout for import profiles: delimiter, decimal separator, the columns as
 * written and which one is time or a sample index. Preamble values (dates, trigger times) are not
 * part of it, so every export of the same instrument set-up has the same signature.
 */
export function headerSignature(sniffed: Pick<SniffedHeader, "delimiter" | "decimal" | "headers" | "timeColumn" | "timeIsIndex">): { signature: string; preview: string } {
  const normal = [sniffed.delimiter, sniffed.decimal, sniffed.timeIsIndex ? "index" : "time", sniffed.timeColumn ?? "", ...sniffed.headers].join("\u001f");
  const preview = sniffed.headers.join(" | ");
  return { signature: `h1-${fnv1a64(normal)}`, preview: preview.length > 300 ? `${preview.slice(0, 299)}…` : preview };
}
