import type { Lab } from "@/colour/types";

const f1 = (n: number) => (Math.abs(n) < 0.05 ? "0.0" : n.toFixed(1));

/** A colour shown large and true (sRGB of its reading) with its CIELAB numbers beside it. */
export function Swatch({
  hex,
  lab,
  inGamut = true,
  label,
  size = "md",
}: {
  hex: string;
  lab?: Lab;
  inGamut?: boolean;
  label?: string;
  size?: "sm" | "md" | "lg";
}) {
  const box = { sm: "h-10 w-10", md: "h-20 w-20", lg: "h-32 w-32" }[size];
  return (
    <figure className="flex items-center gap-3">
      <div className={`${box} shrink-0 rounded-md border border-rule-strong shadow-inner`} style={{ background: hex }} role="img" aria-label={`Colour ${hex}`} />
      <figcaption className="min-w-0 text-sm">
        {label && <p className="font-medium text-ink">{label}</p>}
        {lab && (
          <p className="tabular font-mono text-ink-soft">
            L* {f1(lab.L)} · a* {f1(lab.a)} · b* {f1(lab.b)}
          </p>
        )}
        {!inGamut && <p className="text-caution">Outside what a screen can show; the chip is the nearest displayable colour.</p>}
      </figcaption>
    </figure>
  );
}

/** Dominant colours as one bar split by share, with the shares written underneath. */
export function PaletteBar({ palette }: { palette: { hex: string; share: number }[] }) {
  return (
    <div>
      <div className="flex h-8 overflow-hidden rounded-md border border-rule-strong">
        {palette.map((p, i) => (
          <div key={i} style={{ background: p.hex, width: `${p.share * 100}%` }} title={`${Math.round(p.share * 100)} %`} />
        ))}
      </div>
      <p className="tabular mt-1 text-xs text-ink-soft">{palette.map((p) => `${Math.round(p.share * 100)} %`).join(" · ")}</p>
    </div>
  );
}
