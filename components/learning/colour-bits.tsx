import { labToHex } from "@/colour/spaces";
import type { Lab } from "@/colour/types";

export const hexOf = (lab: Lab): string => labToHex(lab);

const f1 = (n: number) => (Math.abs(n) < 0.05 ? "0.0" : n.toFixed(1));

/** "L* 52.1 · a* 10.3 · b* -4.0" */
export function labText(lab: Lab): string {
  return `L* ${f1(lab.L)} · a* ${f1(lab.a)} · b* ${f1(lab.b)}`;
}

/** A small colour chip with an accessible name. */
export function Chip({ lab, hex, size = "h-8 w-8", label }: { lab?: Lab; hex?: string; size?: string; label?: string }) {
  const h = hex ?? (lab ? labToHex(lab) : "#ccc");
  return <span role="img" aria-label={label ?? `Colour ${h}`} className={`inline-block shrink-0 rounded border border-rule-strong ${size}`} style={{ background: h }} />;
}

/** A predicted gradient along the skein, first section dipped on the left. */
export function LabStrip({ labs, label }: { labs: Lab[]; label: string }) {
  return (
    <div className="flex h-8 overflow-hidden rounded-md border border-rule-strong" role="img" aria-label={label}>
      {labs.map((l, i) => (
        <div key={i} className="flex-1" style={{ background: labToHex(l) }} title={labText(l)} />
      ))}
    </div>
  );
}

export const VERDICT_WORDS: Record<"close" | "noticeable" | "far", string> = {
  close: "Close to the prediction",
  noticeable: "A noticeable difference",
  far: "Far from the prediction",
};
