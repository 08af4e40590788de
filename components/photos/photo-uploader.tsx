"use client";

import { useQueryClient } from "@tanstack/react-query";
import { useCallback, useState } from "react";
import { useDropzone } from "react-dropzone";
import { Button } from "@/components/ui/button";
import { Select } from "@/components/ui/field";
import { Notice } from "@/components/ui/sheet";
import { photoKeys, uploadPhoto, type PhotoKind } from "./use-photos";

export const KIND_LABEL: Record<PhotoKind, string> = {
  base: "Undyed base",
  "after-layer": "After a layer",
  final: "Finished skein",
  "before-wash": "Before the wash test",
  "after-wash": "After the wash test",
};

interface LayerRef {
  id: string;
  position: number;
  method: string;
}

type State = { phase: "idle" } | { phase: "sending"; share: number; name: string } | { phase: "failed"; message: string; file: File };

/** Photo upload from a phone camera or a file, with progress and retry. */
export function PhotoUploader({ studioId, trialId, layers }: { studioId: string; trialId: string; layers: LayerRef[] }) {
  const qc = useQueryClient();
  // Until the dyer picks, the photo documents the newest layer (or the undyed base), following
  // layers added while the page is open.
  const [pickedKind, setKind] = useState<PhotoKind | null>(null);
  const [pickedLayer, setLayerId] = useState<string | null>(null);
  const kind: PhotoKind = pickedKind ?? (layers.length ? "after-layer" : "base");
  const layerId = pickedLayer && layers.some((l) => l.id === pickedLayer) ? pickedLayer : (layers.at(-1)?.id ?? "");
  const [state, setState] = useState<State>({ phase: "idle" });

  const send = useCallback(
    async (file: File) => {
      setState({ phase: "sending", share: 0, name: file.name });
      try {
        await uploadPhoto(studioId, { trialId, layerId: kind === "after-layer" ? layerId || null : null, kind, file }, (share) =>
          setState({ phase: "sending", share, name: file.name }),
        );
        setState({ phase: "idle" });
        await qc.invalidateQueries({ queryKey: photoKeys.trial(studioId, trialId) });
      } catch (e) {
        setState({ phase: "failed", message: (e as Error).message, file });
      }
    },
    [studioId, trialId, kind, layerId, qc],
  );

  const { getRootProps, getInputProps, isDragActive, open } = useDropzone({
    accept: { "image/jpeg": [], "image/png": [], "image/webp": [], "image/heic": [".heic"], "image/heif": [".heif"] },
    maxFiles: 1,
    multiple: false,
    noClick: true,
    onDropAccepted: (files) => void send(files[0]),
    onDropRejected: (r) => setState({ phase: "failed", message: r[0]?.errors[0]?.message ?? "That file cannot be used.", file: r[0].file }),
  });

  return (
    <div className="space-y-3">
      <div className="grid gap-3 sm:grid-cols-2">
        <Select label="The photo shows" value={kind} onChange={(e) => setKind(e.target.value as PhotoKind)}>
          {(Object.keys(KIND_LABEL) as PhotoKind[]).map((k) => (
            <option key={k} value={k} disabled={k === "after-layer" && !layers.length}>
              {KIND_LABEL[k]}
            </option>
          ))}
        </Select>
        {kind === "after-layer" && layers.length > 0 && (
          <Select label="Layer" value={layerId} onChange={(e) => setLayerId(e.target.value)}>
            {layers.map((l) => (
              <option key={l.id} value={l.id}>
                Layer {l.position + 1} — {l.method}
              </option>
            ))}
          </Select>
        )}
      </div>
      <div
        {...getRootProps()}
        className={`rounded-lg border-2 border-dashed p-4 text-center ${isDragActive ? "border-accent bg-accent-soft" : "border-rule-strong bg-sheet"}`}
      >
        <input {...getInputProps()} aria-label="Photo file" />
        <p className="text-ink-soft">Put the swatch beside the reference card, in even daylight, without flash.</p>
        <div className="mt-3 flex flex-col gap-2 sm:flex-row sm:justify-center">
          <label className="inline-flex min-h-11 cursor-pointer items-center justify-center rounded-md border border-accent bg-accent px-4 py-2 font-medium text-accent-ink">
            Take a photo
            <input
              type="file"
              accept="image/*"
              capture="environment"
              className="sr-only"
              onChange={(e) => e.target.files?.[0] && void send(e.target.files[0])}
            />
          </label>
          <Button variant="plain" onClick={open}>
            Choose a file
          </Button>
        </div>
        <p className="mt-2 hidden text-sm text-ink-faint sm:block">or drop a photo here · JPEG, PNG, WebP or HEIC, up to 25 MB</p>
      </div>
      {state.phase === "sending" && (
        <div role="status" aria-live="polite">
          <div className="flex justify-between text-sm text-ink-soft">
            <span className="truncate">Sending {state.name}</span>
            <span className="tabular">{Math.round(state.share * 100)} %</span>
          </div>
          <div className="mt-1 h-2 overflow-hidden rounded-full bg-rule" aria-hidden="true">
            <div className="h-full bg-accent transition-[width]" style={{ width: `${state.share * 100}%` }} />
          </div>
        </div>
      )}
      {state.phase === "failed" && (
        <Notice tone="danger">
          <p>{state.message}</p>
          <Button variant="plain" className="mt-2" onClick={() => void send(state.file)}>
            Try again
          </Button>
        </Notice>
      )}
    </div>
  );
}
