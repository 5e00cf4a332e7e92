import { formatFigure } from "@/lib/verdicts/format-figure";
import { magnificationFor, phasorSet, SMALLEST_DRAWN_FRACTION, tipOf, type Phasor, type PhasorReport } from "./phasor-geometry";

const RADIUS = 120;
const SIZE = 300;
const COLOURS = ["#a85c26", "#17695a", "#3b5bdb"] as const;
const NEGATIVE_COLOUR = "#a3242a";

const volts = (value: number) => `${formatFigure(value, { quantity: "voltage" })} V`;
const degrees = (value: number) => `${formatFigure(value, { quantity: "angle" })}°`;

function Arrow({ phasor, fullScale, colour, dashed = false, label }: { phasor: Phasor; fullScale: number; colour: string; dashed?: boolean; label: string }) {
  const tip = tipOf(phasor, fullScale, RADIUS);
  const length = Math.hypot(tip.x, tip.y);
  const rad = (phasor.angleDeg * Math.PI) / 180;
  const labelAt = { x: tip.x + 14 * Math.cos(rad), y: tip.y - 14 * Math.sin(rad) };
  const head = length > 8 ? { ux: tip.x / length, uy: tip.y / length } : null;
  return (
    <g data-phasor={phasor.id}>
      <line x1={0} y1={0} x2={tip.x} y2={tip.y} stroke={colour} strokeWidth={3} strokeDasharray={dashed ? "6 4" : undefined} />
      {head ? (
        <polygon
          fill={colour}
          points={`${tip.x},${tip.y} ${tip.x - 10 * head.ux + 5 * head.uy},${tip.y - 10 * head.uy - 5 * head.ux} ${tip.x - 10 * head.ux - 5 * head.uy},${tip.y - 10 * head.uy + 5 * head.ux}`}
        />
      ) : null}
      <text x={labelAt.x} y={labelAt.y} fill={colour} fontSize={15} fontWeight={700} textAnchor="middle" dominantBaseline="middle">{label}</text>
    </g>
  );
}

/**
 * The fundamental voltage phasors of a three-phase capture, referred to phase A and drawn
 * counter-clockwise, with the negative-sequence component (magnified when small, and said so).
 * Nothing is drawn without a full phase set.
 */
export function PhasorDiagram({ report }: { report: PhasorReport }) {
  const set = phasorSet(report);
  if (!set) return null;
  const fullScale = Math.max(...set.phases.map((p) => p.rms));
  const magnification = magnificationFor(set.negative.rms, fullScale);
  const shownNegative = { ...set.negative, rms: set.negative.rms * magnification };
  const drawNegative = shownNegative.rms >= SMALLEST_DRAWN_FRACTION * fullScale;
  const order = set.sequence === "positive" ? "A → B → C (positive)" : "A → C → B (negative)";
  return (
    <figure data-testid="phasor-diagram" className="rounded-lg bg-white p-4 shadow-sm ring-1 ring-ink-200">
      <h2 className="mb-2 text-lg font-semibold">Phasors</h2>
      <div className="flex flex-col gap-4 sm:flex-row sm:items-start">
        <svg viewBox={`${-SIZE / 2} ${-SIZE / 2} ${SIZE} ${SIZE}`} className="w-full max-w-[320px] shrink-0" role="img"
          aria-label={`Phasor diagram, ${set.basis === "line-neutral" ? "line-to-neutral" : "line-to-line"}, angles from phase A counter-clockwise; sequence ${order}`}>
          <circle r={RADIUS} fill="none" stroke="#cbd2d6" strokeWidth={1} />
          <circle r={RADIUS / 2} fill="none" stroke="#e3e7ea" strokeWidth={1} />
          <line x1={-RADIUS - 8} y1={0} x2={RADIUS + 8} y2={0} stroke="#cbd2d6" strokeWidth={1} />
          <line x1={0} y1={-RADIUS - 8} x2={0} y2={RADIUS + 8} stroke="#cbd2d6" strokeWidth={1} />
          <text x={RADIUS + 10} y={-6} fontSize={11} fill="#4a5a63">0°</text>
          <text x={4} y={-RADIUS - 10} fontSize={11} fill="#4a5a63">90°</text>
          <path d={`M ${RADIUS * 0.3} 0 A ${RADIUS * 0.3} ${RADIUS * 0.3} 0 0 0 ${RADIUS * 0.3 * Math.cos(Math.PI / 4)} ${-RADIUS * 0.3 * Math.sin(Math.PI / 4)}`} fill="none" stroke="#4a5a63" strokeWidth={1} markerEnd="url(#ccw)" />
          <defs><marker id="ccw" markerWidth={6} markerHeight={6} refX={3} refY={3} orient="auto"><path d="M0,0 L6,3 L0,6 z" fill="#4a5a63" /></marker></defs>
          {set.phases.map((p, i) => <Arrow key={p.id} phasor={p} fullScale={fullScale} colour={COLOURS[i] as string} label={p.name.slice(0, 1)} />)}
          {drawNegative ? <Arrow phasor={shownNegative} fullScale={fullScale} colour={NEGATIVE_COLOUR} dashed label="V₂" /> : null}
        </svg>
        <div className="min-w-0 text-sm">
          <table className="w-full" aria-label="Fundamental phasors">
            <thead className="text-left text-xs text-ink-600"><tr><th className="pr-3">Phasor</th><th className="pr-3">RMS</th><th>Angle</th></tr></thead>
            <tbody className="tabular-nums">
              {set.phases.map((p, i) => (
                <tr key={p.id}><td className="pr-3 font-semibold" style={{ color: COLOURS[i] }}>{p.name} <span className="font-mono text-xs text-ink-600">{p.id}</span></td><td className="pr-3">{volts(p.rms)}</td><td>{degrees(p.angleDeg)}</td></tr>
              ))}
              <tr className="border-t border-ink-100"><td className="pr-3">Positive V₁</td><td className="pr-3">{volts(set.positive.rms)}</td><td>{degrees(set.positive.angleDeg)}</td></tr>
              <tr><td className="pr-3 font-semibold" style={{ color: NEGATIVE_COLOUR }}>Negative V₂</td><td className="pr-3">{volts(set.negative.rms)}</td><td>{set.negative.rms > 0 ? degrees(set.negative.angleDeg) : "—"}</td></tr>
              <tr><td className="pr-3">Zero V₀</td><td className="pr-3">{volts(set.zero.rms)}</td><td>{set.zero.rms > 0 ? degrees(set.zero.angleDeg) : "—"}</td></tr>
            </tbody>
          </table>
          <p className="mt-2">Sequence <strong data-testid="phasor-sequence">{order}</strong></p>
          <p>V₂ / V₁ <strong className="tabular-nums">{set.negativePercent === null ? "—" : `${formatFigure(set.negativePercent, { quantity: "percent" })} %`}</strong></p>
          <figcaption className="mt-2 text-xs text-ink-600">
            Fundamental {set.basis === "line-neutral" ? "line-to-neutral" : "line-to-line"} voltages; angles from phase A, counter-clockwise positive; the circle is {volts(fullScale)}.
            {drawNegative ? (magnification > 1 ? ` V₂ is drawn ×${magnification} (dashed) so it can be seen.` : " V₂ is dashed.") : " V₂ is too small to draw at this scale."}
          </figcaption>
        </div>
      </div>
    </figure>
  );
}
