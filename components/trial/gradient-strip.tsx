import type { LayerDto } from "@/lib/trials/types";

/** Mixes the layer's dye colours by their depth of shade (plain sRGB average: a sketch, not a prediction). */
export function layerHex(dyes: Pick<LayerDto["dyes"][number], "displayHex" | "dosPct">[]): string {
  const coloured = dyes.filter((d) => d.displayHex && /^#[0-9a-f]{6}$/i.test(d.displayHex));
  const total = coloured.reduce((s, d) => s + Math.max(d.dosPct, 0.0001), 0);
  if (!coloured.length || total === 0) return "#8a8176";
  const rgb = [0, 0, 0];
  for (const d of coloured) {
    const w = Math.max(d.dosPct, 0.0001) / total;
    for (let i = 0; i < 3; i++) rgb[i] += parseInt(d.displayHex!.slice(1 + 2 * i, 3 + 2 * i), 16) * w;
  }
  return `#${rgb.map((c) => Math.round(c).toString(16).padStart(2, "0")).join("")}`;
}

/**
 * A dip gradient as a strip of sections, the first dipped on the left, each tinted by its depth.
 * It shows the plan, not the measured result.
 */
export function GradientStrip({ gradient, hex }: { gradient: NonNullable<LayerDto["gradient"]>; hex: string }) {
  return (
    <figure>
      <div className="flex h-10 overflow-hidden rounded-md border border-rule-strong" role="img" aria-label={`Gradient in ${gradient.sections} sections, depths ${gradient.depths.map((d) => `${Math.round(d * 100)} %`).join(", ")}`}>
        {gradient.depths.map((d, i) => (
          <div key={i} className="relative flex-1 border-r border-sheet/60 last:border-r-0 bg-sheet">
            <div className="absolute inset-0" style={{ backgroundColor: hex, opacity: d }} />
          </div>
        ))}
      </div>
      <figcaption className="tabular mt-1 flex justify-between text-xs text-ink-soft">
        {gradient.depths.map((d, i) => (
          <span key={i} className="flex-1 text-center">
            {Math.round(d * 100)} %
          </span>
        ))}
      </figcaption>
    </figure>
  );
}
