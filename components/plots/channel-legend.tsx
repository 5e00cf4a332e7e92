/** One entry per channel: its colour, column name and unit. */
export function ChannelLegend({ channels }: { channels: { id: string; unit: string; colour: string }[] }) {
  return (
    <ul aria-label="Channels" data-testid="plot-legend" className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-xs">
      {channels.map((c) => (
        <li key={c.id} className="flex items-center gap-1.5">
          <span aria-hidden className="inline-block h-2 w-4 rounded-sm" style={{ backgroundColor: c.colour }} />
          <span className="font-mono">{c.id}</span> <span className="text-ink-600">({c.unit})</span>
        </li>
      ))}
    </ul>
  );
}
