// Form fields are named by the dotted path of the value they fill ("nameplate.ke.value",
// "checks.voltage.lowerPercent"), so a zod issue's path names the input it belongs to. This turns such
// a form into the nested object the input schemas parse; it coerces nothing it cannot read, so a
// wrong entry still reaches zod and gets its message.

const NUMERIC = new Set([
  "phases", "poles", "ratedSpeedRpm", "nominalVoltageV", "frequencyHz", "ratedKva", "ratedKw", "value", "magnetReferenceC",
  "marginalZonePercent", "harmonicOrder", "plausibilityFactor", "lowerPercent", "upperPercent", "maxPercent", "toleranceDeg", "max",
  "speedMinRpm", "speedMaxRpm", "speedRpm", "speedTolerancePercent",
]);
const BOOLEAN = new Set(["required", "verified"]);
const LISTS = new Set(["requiredRoles", "checks"]);

type Entries = Iterable<[string, FormDataEntryValue]>;
type Tree = { [key: string]: unknown };

function coerce(leaf: string, raw: string): unknown {
  if (NUMERIC.has(leaf)) {
    const n = Number(raw.replace(/\s/g, "").replace(",", "."));
    return Number.isFinite(n) ? n : raw;
  }
  if (BOOLEAN.has(leaf)) return raw === "true" || raw === "on";
  return raw;
}

/** Nested object from dotted field names; empty fields are left out; list fields collect every value. */
export function unflattenForm(entries: Entries): Tree {
  const out: Tree = {};
  for (const [name, value] of entries) {
    if (name.startsWith("$") || typeof value !== "string") continue;
    const parts = name.split(".");
    const leaf = parts[parts.length - 1] ?? name;
    if (!LISTS.has(leaf) && value.trim() === "") continue;
    let node = out;
    for (const part of parts.slice(0, -1)) {
      const next = node[part];
      node = (typeof next === "object" && next !== null && !Array.isArray(next) ? next : (node[part] = {})) as Tree;
    }
    if (LISTS.has(leaf)) {
      const list = Array.isArray(node[leaf]) ? (node[leaf] as unknown[]) : [];
      if (value.trim() !== "") list.push(value.trim());
      node[leaf] = list;
      continue;
    }
    node[leaf] = coerce(leaf, value.trim());
  }
  return out;
}
