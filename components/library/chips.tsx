import type { ReactNode } from "react";

// Small labels used across the library lists: tone chips, a dye's swatch, the stock age chip.

type Tone = "plain" | "caution" | "ok" | "accent";
const tones: Record<Tone, string> = {
  plain: "border-rule-strong bg-paper text-ink-soft",
  caution: "border-caution/40 bg-caution-soft text-caution",
  ok: "border-ok/30 bg-ok-soft text-ok",
  accent: "border-accent/30 bg-accent-soft text-accent",
};

export function Chip({ tone = "plain", children, title }: { tone?: Tone; children: ReactNode; title?: string }) {
  return (
    <span title={title} className={`inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-sm whitespace-nowrap ${tones[tone]}`}>
      {children}
    </span>
  );
}

/** The dye's display colour as a small square; an empty dashed square when there is none. */
export function Swatch({ hex, size = "md" }: { hex: string | null; size?: "md" | "lg" }) {
  const box = size === "lg" ? "h-10 w-10" : "h-6 w-6";
  return hex ? (
    <span aria-hidden="true" className={`inline-block shrink-0 rounded border border-ink/15 ${box}`} style={{ backgroundColor: hex }} />
  ) : (
    <span aria-hidden="true" className={`inline-block shrink-0 rounded border border-dashed border-rule-strong ${box}`} />
  );
}

/** "12 days" or "97 days · past the 60-day shelf life", in caution colours when old. */
export function StockAge({ ageDays, shelfLifeDays, pastShelfLife }: { ageDays: number; shelfLifeDays: number; pastShelfLife: boolean }) {
  const days = `${ageDays} ${ageDays === 1 ? "day" : "days"}`;
  if (!pastShelfLife) return <Chip>{ageDays === 0 ? "mixed today" : `${days} old`}</Chip>;
  return (
    <Chip tone="caution" title={`Older than the studio's ${shelfLifeDays}-day shelf life: check it, or mix a fresh jar before a dye lot.`}>
      <span aria-hidden="true">⚠</span> {days} old · past {shelfLifeDays}-day shelf life
    </Chip>
  );
}
