"use client";

export type UploadInstrumentOptions = {
  instruments: { id: string; label: string }[];
  /** Each bench's default set, by bench id. */
  benchSets: Record<string, string[]>;
};

/** The instruments sent with the upload: the bench's default set, ticked, editable before sending. */
export function UploadInstruments({ options, value, onChange }: { options: UploadInstrumentOptions; value: string[]; onChange: (ids: string[]) => void }) {
  if (options.instruments.length === 0) return <p className="text-sm text-ink-600">No instruments in the register: the figures&apos; uncertainty will not be evaluated.</p>;
  const toggle = (id: string, on: boolean) => onChange(on ? [...value, id] : value.filter((v) => v !== id));
  return (
    <fieldset className="text-sm">
      <legend className="font-semibold text-ink-800">Instruments</legend>
      <p className="text-xs text-ink-600">Defaulted from the bench; their accuracy gives each figure&apos;s uncertainty.</p>
      <div className="mt-1 grid gap-1 sm:grid-cols-2">
        {options.instruments.map((i) => (
          <label key={i.id} className="flex items-center gap-2"><input type="checkbox" checked={value.includes(i.id)} onChange={(e) => toggle(i.id, e.target.checked)} />{i.label}</label>
        ))}
      </div>
    </fieldset>
  );
}
