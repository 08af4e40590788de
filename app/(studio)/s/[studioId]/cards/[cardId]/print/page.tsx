import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { labToHex } from "@/colour/spaces";
import { isUuid } from "@/lib/auth/with-studio";
import { getEm } from "@/lib/db";
import { getCard } from "@/lib/photos/cards";
import { requireMembership } from "@/lib/pages/studio";
import { StudioSchema } from "@/entities";
import { PrintButton } from "@/components/ui/print-button";

export const metadata: Metadata = { title: "Print a reference card" };

const PATCH_MM = 18;
const GAP_MM = 2;

/** A designed page: the card's patches at their printed size, with how to use and trust it. */
export default async function PrintCardPage({ params }: { params: Promise<{ studioId: string; cardId: string }> }) {
  const { studioId, cardId } = await params;
  await requireMembership(studioId);
  if (!isUuid(cardId)) notFound();
  const em = await getEm();
  const studio = await em.findOneOrFail(StudioSchema, { id: studioId });
  const card = await getCard(em, studio, cardId).catch(() => notFound());
  return (
    <article className="mx-auto max-w-[190mm] bg-white p-6 text-ink print:p-0">
      <div className="no-print mb-4">
        <PrintButton />
      </div>
      <header className="border-b border-ink pb-2">
        <p className="text-sm uppercase tracking-wide">{studio.name} · Undertone reference card</p>
        <h1 className="text-2xl">{card.name}</h1>
      </header>
      <div
        className="mt-6 inline-grid border-[3mm] border-neutral-900 bg-neutral-900 p-[3mm]"
        style={{ gridTemplateColumns: `repeat(${card.cols}, ${PATCH_MM}mm)`, gap: `${GAP_MM}mm` }}
      >
        {card.patches.map((p, i) => (
          <div key={i} style={{ width: `${PATCH_MM}mm`, height: `${PATCH_MM}mm`, background: labToHex(p), printColorAdjust: "exact", WebkitPrintColorAdjust: "exact" }} />
        ))}
      </div>
      <table className="tabular mt-6 w-full text-xs">
        <thead>
          <tr className="border-b border-ink text-left">
            <th>#</th>
            <th>Patch</th>
            <th>L*</th>
            <th>a*</th>
            <th>b*</th>
          </tr>
        </thead>
        <tbody>
          {card.patches.map((p, i) => (
            <tr key={i} className="border-b border-neutral-300">
              <td>{i + 1}</td>
              <td>{p.name}</td>
              <td>{p.L.toFixed(1)}</td>
              <td>{p.a.toFixed(1)}</td>
              <td>{p.b.toFixed(1)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <section className="mt-6 space-y-2 text-sm">
        <p className="font-semibold">Before you trust this card</p>
        <p>
          Printers, inks and papers change colours: the printed patches will not match the values above. Measure each
          printed patch (a spectrophotometer or colorimeter, D65/2°) and enter the measured values in Undertone before
          relying on readings. Until then, readings are indicative only.
        </p>
        <p>
          Keep the card flat, dry and out of the light; dye splashes and fading change it. In every swatch photo, place the
          card beside the yarn in the same light, with no glare on the patches.
        </p>
      </section>
    </article>
  );
}
