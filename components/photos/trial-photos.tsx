"use client";

import Link from "next/link";
import { approximateWashGrade } from "@/colour/judgement";
import { useCan } from "@/components/studio/studio-context";
import { EmptyState, Notice, SectionTitle, Sheet } from "@/components/ui/sheet";
import { PaletteBar, Swatch } from "@/components/ui/swatch";
import { KIND_LABEL, PhotoUploader } from "./photo-uploader";
import { useTrialPhotos, type ReadingDto } from "./use-photos";

const QUALITY_WORDS = { good: "Calibration good", usable: "Calibration usable", retake: "Retake advised" } as const;

export function ReadingCard({ r }: { r: ReadingDto }) {
  return (
    <div className="space-y-2 rounded-md border border-rule p-3">
      <Swatch hex={r.hex} lab={r.lab} inGamut={r.inGamut} label={r.label || KIND_LABEL[r.photoKind]} />
      {r.palette.length > 1 && <PaletteBar palette={r.palette} />}
      <p className="text-xs text-ink-soft">
        {r.calibration
          ? `${QUALITY_WORDS[r.calibration.quality]} · card patches left out one at a time: mean ΔE00 ${r.calibration.looMeanDe00.toFixed(1)}, worst ${r.calibration.looMaxDe00.toFixed(1)}`
          : "No reference card: read as plain sRGB, an indication only."}
      </p>
      {r.remeasuring && (
        <p className="text-xs font-medium text-accent" role="status">
          The card&apos;s values changed: measuring this reading again…
        </p>
      )}
    </div>
  );
}

/** The approximate grey-scale grade from the before- and after-wash readings, when both exist. */
function WashGrade({ readings }: { readings: ReadingDto[] }) {
  const before = readings.filter((r) => r.photoKind === "before-wash").at(-1);
  const after = readings.filter((r) => r.photoKind === "after-wash").at(-1);
  if (!before || !after) return null;
  const g = approximateWashGrade(before.lab, after.lab);
  return (
    <Notice tone="info" className="mt-3">
      <p className="font-medium">Colour change after washing: grade {g.label} (approximate)</p>
      <p className="tabular">ΔE00 {g.de00.toFixed(1)} · ΔE*ab {g.deltaEab.toFixed(1)}</p>
      <p className="mt-1 text-xs">
        An indication from phone photos on the grey-scale of ISO 105-A02, not a laboratory grade: 5 means no change, 1 a
        severe one.
      </p>
    </Notice>
  );
}

export function TrialPhotos({ studioId, trialId, layers }: { studioId: string; trialId: string; layers: { id: string; position: number; method: string }[] }) {
  const data = useTrialPhotos(studioId, trialId);
  const canUpload = useCan("photo.upload");
  const photos = data.data?.photos ?? [];
  const readings = data.data?.readings ?? [];
  return (
    <Sheet>
      <SectionTitle>Photos and readings</SectionTitle>
      {photos.length === 0 && !data.isPending && (
        <EmptyState title="No photos yet">
          {canUpload ? "Photograph the swatch next to the studio's reference card to get a calibrated reading." : "Nothing photographed yet."}
        </EmptyState>
      )}
      <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3">
        {photos.map((p) => (
          <li key={p.id} className="overflow-hidden rounded-md border border-rule bg-paper">
            <Link href={`/s/${studioId}/trials/${trialId}/photos/${p.id}`} className="block">
              {/* eslint-disable-next-line @next/next/no-img-element */}
              <img src={p.urls.thumb} alt={KIND_LABEL[p.kind]} width={320} height={320} className="aspect-square w-full object-cover" />
              <p className="px-2 py-1 text-sm">
                {KIND_LABEL[p.kind]}
                {p.layerId && ` ${(layers.find((l) => l.id === p.layerId)?.position ?? 0) + 1}`}
                <span className="block text-xs text-ink-faint">
                  {readings.filter((r) => r.photoId === p.id).length} reading(s) · {canUpload ? "measure" : "view"}
                </span>
              </p>
            </Link>
          </li>
        ))}
      </ul>
      {readings.length > 0 && (
        <div className="mt-4 grid gap-3 sm:grid-cols-2">
          {readings.map((r) => (
            <ReadingCard key={r.id} r={r} />
          ))}
        </div>
      )}
      <WashGrade readings={readings} />
      {canUpload && (
        <div className="mt-4 border-t border-rule pt-4">
          <PhotoUploader studioId={studioId} trialId={trialId} layers={layers} />
        </div>
      )}
    </Sheet>
  );
}
