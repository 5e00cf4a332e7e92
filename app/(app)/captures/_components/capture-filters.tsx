import { TEST_KIND_LABELS, TEST_KINDS } from "@/lib/captures/input-schemas";
import type { CaptureListQuery } from "@/lib/captures/list-query";

const STATES = [["uploading", "Uploading"], ["queued", "Queued"], ["analysing", "Analysing"], ["analysed", "Analysed"], ["rejected", "Rejected"], ["failed", "Failed"]] as const;
const VERDICTS = [["fail", "Outside"], ["marginal", "Near edge"], ["pass", "Within"], ["not-applicable", "Not judged"], ["unjudged", "No result yet"]] as const;

const selectCls = "mt-1 block rounded-md border border-ink-200 bg-white px-3 py-2";

/** A plain GET form: filters live in the URL, so a filtered list can be bookmarked and shared. */
export function CaptureFilters({ query }: { query: CaptureListQuery }) {
  return (
    <form className="mb-4 flex flex-wrap items-end gap-3 text-sm" role="search" aria-label="Filter captures">
      <label>
        <span className="block font-semibold">Serial contains</span>
        <input name="q" defaultValue={query.q ?? ""} className="mt-1 rounded-md border border-ink-200 px-3 py-2" />
      </label>
      <label>
        <span className="block font-semibold">State</span>
        <select name="state" defaultValue={query.state ?? ""} className={selectCls}>
          <option value="">Any</option>
          {STATES.map(([value, label]) => <option key={value} value={value}>{label}</option>)}
        </select>
      </label>
      <label>
        <span className="block font-semibold">Verdict</span>
        <select name="overall" defaultValue={query.overall ?? ""} className={selectCls}>
          <option value="">Any</option>
          {VERDICTS.map(([value, label]) => <option key={value} value={value}>{label}</option>)}
        </select>
      </label>
      <label>
        <span className="block font-semibold">Test</span>
        <select name="kind" defaultValue={query.kind ?? ""} className={selectCls}>
          <option value="">Any</option>
          {TEST_KINDS.map((kind) => <option key={kind} value={kind}>{TEST_KIND_LABELS[kind]}</option>)}
        </select>
      </label>
      {query.sort !== "captured" ? <input type="hidden" name="sort" value={query.sort} /> : null}
      {query.dir !== "desc" ? <input type="hidden" name="dir" value={query.dir} /> : null}
      <button className="rounded-md bg-ink-800 px-4 py-2 font-semibold text-white">Show</button>
    </form>
  );
}
