import type { LotDto } from "./use-colourways";
import { Chip } from "./colour-bits";

/** The colourway's dye lots, judged against the target: chip, ΔE CMC(2:1), ΔE00 and which way a failing lot missed. */
export function LotsTable({ lots }: { lots: LotDto[] }) {
  if (!lots.length) return <p className="text-ink-soft">No dye lots yet.</p>;
  return (
    <ul className="divide-y divide-rule" aria-label="Dye lots">
      {lots.map((l) => (
        <li key={l.id} className="flex items-start gap-3 py-3" data-testid={`lot-${l.code}`}>
          {l.lab ? <Chip lab={l.lab} size="h-11 w-11" label={`Lot ${l.code} colour`} /> : <span className="h-11 w-11 shrink-0 rounded border border-dashed border-rule-strong" />}
          <div className="min-w-0 flex-1 text-sm">
            <p className="flex flex-wrap items-baseline gap-x-2">
              <span className="font-medium text-base">{l.code}</span>
              <span className="tabular text-ink-soft">
                {l.skeins} skein{l.skeins === 1 ? "" : "s"} · {l.fibreWeightG} g
              </span>
            </p>
            {l.pass == null ? (
              <p className="text-ink-soft">Not measured yet</p>
            ) : (
              <>
                <p className="tabular">
                  <span className={`font-medium ${l.pass ? "text-ok" : "text-danger"}`}>{l.pass ? "Pass" : "Fail"}</span>
                  {" · "}ΔE CMC(2:1) {l.cmc21!.toFixed(2)} (≤ {l.tolerance.toFixed(1)}) · ΔE00 {l.de00!.toFixed(2)}
                </p>
                {!l.pass && l.misses.length > 0 && <p className="text-ink-soft">Missed: {l.misses.join(", ")}</p>}
              </>
            )}
          </div>
        </li>
      ))}
    </ul>
  );
}
