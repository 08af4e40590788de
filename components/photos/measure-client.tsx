"use client";

import Link from "next/link";
import { useMemo, useState } from "react";
import { useCan, useStudio } from "@/components/studio/studio-context";
import { Button } from "@/components/ui/button";
import { Select } from "@/components/ui/field";
import { Notice, SectionTitle, Sheet } from "@/components/ui/sheet";
import { KIND_LABEL } from "./photo-uploader";
import { ReadingCard } from "./trial-photos";
import { useCards, useCreateReadings, useTrialPhotos } from "./use-photos";

type Pt = { x: number; y: number };
const CORNER_NAMES = ["top-left", "top-right", "bottom-right", "bottom-left"];
const ZOOMS = [1, 1.5, 2, 3];

/** Mark the card's patch area and a swatch on a photo, then read the swatch's calibrated colour. */
export function MeasureClient({ trialId, photoId }: { trialId: string; photoId: string }) {
  const { studioId } = useStudio();
  const canMeasure = useCan("photo.upload");
  const data = useTrialPhotos(studioId, trialId);
  const cards = useCards(studioId);
  const create = useCreateReadings(studioId, trialId, photoId);
  const photo = data.data?.photos.find((p) => p.id === photoId);
  const readings = (data.data?.readings ?? []).filter((r) => r.photoId === photoId);
  const [cardId, setCardId] = useState<string>("");
  const [corners, setCorners] = useState<Pt[]>([]);
  const [swatch, setSwatch] = useState<Pt[]>([]);
  const [zoom, setZoom] = useState(0);
  const chosenCard = cardId || cards.data?.[0]?.id || "";
  const useCard = chosenCard !== "none";
  const step = useCard && corners.length < 4 ? "corners" : swatch.length < 2 ? "swatch" : "ready";

  const rect = useMemo(() => {
    if (swatch.length < 2) return null;
    const [a, b] = swatch;
    return { x: Math.min(a.x, b.x), y: Math.min(a.y, b.y), width: Math.abs(a.x - b.x), height: Math.abs(a.y - b.y) };
  }, [swatch]);

  if (!photo) return <p className="text-ink-soft">{data.isPending ? "Loading…" : "This photo was not found."}</p>;
  const W = photo.width ?? 1, H = photo.height ?? 1;

  function tap(e: React.MouseEvent<HTMLDivElement>) {
    if (!canMeasure) return;
    const box = e.currentTarget.getBoundingClientRect();
    const p = { x: ((e.clientX - box.left) / box.width) * W, y: ((e.clientY - box.top) / box.height) * H };
    if (step === "corners") setCorners((c) => [...c, p]);
    else if (step === "swatch") setSwatch((s) => [...s, p]);
  }

  const pct = (p: Pt) => ({ left: `${(p.x / W) * 100}%`, top: `${(p.y / H) * 100}%` });
  const instruction =
    step === "corners"
      ? `Tap the ${CORNER_NAMES[corners.length]} corner of the card's patch area (${corners.length + 1} of 4).`
      : step === "swatch"
        ? swatch.length === 0
          ? "Tap one corner of an area of yarn to read."
          : "Tap the opposite corner of the yarn area."
        : "Ready to read the marked area.";

  return (
    <div className="space-y-4">
      <Link href={`/s/${studioId}/trials/${trialId}`} className="inline-flex min-h-11 items-center text-accent underline underline-offset-4">
        ← Back to the trial
      </Link>
      <h1 className="text-2xl">{KIND_LABEL[photo.kind]}</h1>
      {canMeasure && (
        <Sheet className="space-y-3">
          <Select label="Reference card in the photo" value={chosenCard} onChange={(e) => { setCardId(e.target.value); setCorners([]); }}>
            {cards.data?.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name} ({c.rows} × {c.cols}{c.measured ? ", measured" : ", nominal values"})
              </option>
            ))}
            <option value="none">No card in this photo (indication only)</option>
          </Select>
          <p role="status" className="font-medium">{instruction}</p>
          <div className="flex flex-wrap gap-2">
            <Button variant="plain" onClick={() => { setCorners([]); setSwatch([]); }}>Start over</Button>
            <Button variant="plain" className="min-w-12" aria-label="Zoom out" onClick={() => setZoom((z) => Math.max(0, z - 1))} disabled={zoom === 0}>−</Button>
            <Button variant="plain" className="min-w-12" aria-label="Zoom in" onClick={() => setZoom((z) => Math.min(ZOOMS.length - 1, z + 1))} disabled={zoom === ZOOMS.length - 1}>+</Button>
          </div>
        </Sheet>
      )}
      <div className="overflow-auto rounded-md border border-rule bg-ink/5" style={{ maxHeight: "70dvh" }}>
        <div data-testid="photo-canvas" className="relative cursor-crosshair select-none" style={{ width: `${ZOOMS[zoom] * 100}%` }} onClick={tap}>
          {/* eslint-disable-next-line @next/next/no-img-element */}
          <img src={photo.urls.web} alt="The photo to measure" className="block w-full" draggable={false} />
          {corners.map((p, i) => (
            <span key={i} className="absolute -translate-x-1/2 -translate-y-1/2 rounded-full border-2 border-white bg-accent px-1.5 text-xs text-white shadow" style={pct(p)}>
              {i + 1}
            </span>
          ))}
          {corners.length === 4 && (
            <svg className="pointer-events-none absolute inset-0 h-full w-full" viewBox={`0 0 ${W} ${H}`} preserveAspectRatio="none" aria-hidden="true">
              <polygon points={corners.map((p) => `${p.x},${p.y}`).join(" ")} fill="none" stroke="white" strokeWidth={W / 300} strokeDasharray={`${W / 100}`} />
            </svg>
          )}
          {swatch.length === 1 && <span className="absolute h-3 w-3 -translate-x-1/2 -translate-y-1/2 rounded-full border-2 border-white bg-ink" style={pct(swatch[0])} />}
          {rect && (
            <span
              className="absolute border-2 border-white outline outline-2 outline-ink"
              style={{ left: `${(rect.x / W) * 100}%`, top: `${(rect.y / H) * 100}%`, width: `${(rect.width / W) * 100}%`, height: `${(rect.height / H) * 100}%` }}
            />
          )}
        </div>
      </div>
      {create.error && <Notice tone="danger">{create.error.message}</Notice>}
      {canMeasure && (
        <div className="sticky bottom-20 z-20 md:bottom-4">
          <Button
            className="w-full shadow-lg"
            disabled={step !== "ready" || create.isPending}
            onClick={() =>
              rect &&
              create.mutate(
                { cardId: useCard ? chosenCard : null, corners: useCard ? corners : null, regions: [{ label: "", rect }] },
                { onSuccess: () => setSwatch([]) },
              )
            }
          >
            {create.isPending ? "Reading…" : "Read the colour"}
          </Button>
        </div>
      )}
      {readings.length > 0 && (
        <Sheet>
          <SectionTitle>Readings of this photo</SectionTitle>
          <div className="grid gap-3 sm:grid-cols-2">
            {readings.map((r) => (
              <ReadingCard key={r.id} r={r} />
            ))}
          </div>
        </Sheet>
      )}
    </div>
  );
}
