import { analyseCapture } from "@/lib/analysis";
import { readCaptureFile } from "@/lib/server/capture-reader";
import { readStoredCapture } from "@/lib/server/stored-capture";
import { spoolObject } from "@/lib/server/object-spool";
import { openObjectRange } from "@/lib/server/storage";
const [key, etag, size] = process.argv.slice(2);
const mode = process.argv[5];
const t0 = performance.now();
if (mode === "local") {
  const c = await readCaptureFile(".data/bench/capture-1024MiB.csv");
  console.log("local parse", ((performance.now() - t0) / 1000).toFixed(2), c.sampleCount);
} else if (mode === "download") {
  const s = await spoolObject({ size: Number(size), fetchRange: (a, b, sig) => openObjectRange(key!, a, b, etag, sig) });
  await s.done(); const t1 = performance.now();
  console.log("download", ((t1 - t0) / 1000).toFixed(2)); await s.sha256();
  console.log("download+hash", ((performance.now() - t0) / 1000).toFixed(2)); await s.close();
} else {
  const r = await readStoredCapture({ objectKey: key!, objectEtag: etag!, sizeBytes: Number(size) }, {}, () => {});
  console.log("stored parse", ((performance.now() - t0) / 1000).toFixed(2), r.path, r.parsed?.sampleCount);
}
