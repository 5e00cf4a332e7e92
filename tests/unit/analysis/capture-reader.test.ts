import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { parseCaptureText } from "@/lib/analysis";
import { readCapture, readCaptureFile } from "@/lib/server/capture-reader";
import { FIXTURE_DIR } from "./fixtures";

const file = path.join(FIXTURE_DIR, "layouts", "semicolon-comma-preamble-bom-crlf.csv");

/** Yields every chunk from one buffer and scribbles over it afterwards, like a pooled reader. */
async function* reusedBuffer(bytes: Uint8Array, size: number): AsyncGenerator<Uint8Array> {
  const buffer = new Uint8Array(size);
  for (let offset = 0; offset < bytes.length; offset += size) {
    const part = bytes.subarray(offset, offset + size);
    buffer.set(part);
    yield buffer.subarray(0, part.length);
    buffer.fill(0x7a);
  }
}

describe("readCapture", () => {
  const expected = parseCaptureText(new TextDecoder().decode(readFileSync(file)));

  it("readCapture(a source that reuses its buffer) keeps nothing it was handed (streaming contract)", async () => {
    const capture = await readCapture(reusedBuffer(readFileSync(file), 333));
    expect(capture.sampleCount).toBe(expected.sampleCount);
    capture.channels.forEach((channel, index) => expect(Array.from(channel.samples)).toEqual(Array.from(expected.channels[index]!.samples)));
  });

  it("readCaptureFile(path) equals parsing the text in one piece (same path)", async () => {
    const capture = await readCaptureFile(file);
    expect(capture.metadata).toEqual(expected.metadata);
    capture.channels.forEach((channel, index) => expect(Array.from(channel.samples)).toEqual(Array.from(expected.channels[index]!.samples)));
  });
});
