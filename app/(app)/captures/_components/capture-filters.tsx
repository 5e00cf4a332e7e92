import { TEST_KIND_LABELS, TEST_KINDS } from "@/lib/captures/input-schemas";
import type { CaptureListQuery } from "@/lib/captures/list-query";

const STATES = [["uploading", "Uploading"], ["queued", "Queued"], ["analysing", "Analysing"], ["analysed", "Analysed"], ["rejected", "Rejected"], ["failed", "Failed"]] as const;
const VERDICTS = [["fail", "Outside"], ["inconclusive", "Inconclusive"], ["marginal", "Near edge"], ["pass", "Within"], ["not-applicable", "Not judged (older engine)"], ["unjudged", "No result yet"]] as const;

function FilterSelect({ name, label, value, options }: { name: string; label: string; value: string | undefined; options: readonly (readonly [string, string])[] }) {
  return (
    <label>
      <span className="block font-semibold">{label}</span>
      <select name={name} defaultValue={value ?? ""} className="mt-1 block rounded-md border border-ink-200 bg-white px-3 py-2">
        <option value="">Any</option>
        {options.map(([v, text]) => <option key={v} value={v}>{text}</option>)}
      </select>
    </label>
  );
}

/** A plain GET form: filters live in the URL, so a filtered list can be bookmarked and shared. */
export function CaptureFilters({ query }: { query: CaptureListQuery }) {
  return (
    <form className="mb-4 flex flex-wrap items-end gap-3 text-sm" role="search" aria-label="Filter captures">
      <label>
        <span className="block font-semibold">Serial contains</span>
        <input name="q" defaultValue={query.q ?? ""} className="mt-1 rounded-md border border-ink-200 px-3 py-2" />
      </label>
      <FilterSelect name="state" label="State" value={query.state} options={STATES} />
      <FilterSelect name="overall" label="Verdict" value={query.overall} options={VERDICTS} />
      <FilterSelect name="kind" label="Test" value={query.kind} options={TEST_KINDS.map((kind) => [kind, TEST_KIND_LABELS[kind]] as const)} />
      {query.sort !== "captured" ? <input type="hidden" name="sort" value={query.sort} /> : null}
      {query.dir !== "desc" ? <input type="hidden" name="dir" value={query.dir} /> : null}
      <button className="rounded-md bg-ink-800 px-4 py-2 font-semibold text-white">Show</button>
    </form>
  );
}
