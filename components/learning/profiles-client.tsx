"use client";

import Link from "next/link";
import { useCan, useStudio } from "@/components/studio/studio-context";
import { Button } from "@/components/ui/button";
import { EmptyState, Notice } from "@/components/ui/sheet";
import { Chip } from "./colour-bits";
import { useProfiles, useRefitProfiles } from "./use-profiles";

// How well a profile reproduces its own dyeings, in our verdict bands (close ≤ 2, noticeable ≤ 5 ΔE00).
const fitWords = (mean: number) => (mean <= 2 ? "fits well" : mean <= 5 ? "fits roughly" : "fits poorly");

/** Which dyes the studio can predict with, per fibre class, from how many dyeings and how well. */
export function ProfilesClient() {
  const { studioId } = useStudio();
  const canRefit = useCan("prediction.run");
  const q = useProfiles(studioId);
  const refit = useRefitProfiles(studioId);
  const classes = [...new Set(q.data?.map((p) => p.fibreClass) ?? [])];
  return (
    <div className="space-y-4">
      <Link href={`/s/${studioId}/colourways`} className="inline-flex min-h-11 items-center text-accent">
        ← Colourways
      </Link>
      <header className="flex flex-wrap items-end justify-between gap-3">
        <h1 className="text-3xl">Dye profiles</h1>
        {canRefit && (
          <Button variant="plain" onClick={() => refit.mutate()} disabled={refit.isPending}>
            {refit.isPending ? "Fitting…" : "Fit again from all dyeings"}
          </Button>
        )}
      </header>
      <p className="text-ink-soft">Learnt from the studio’s own measured dyeings; predictions use the profiles of the base’s fibre class.</p>
      {refit.data && (
        <Notice tone="ok">
          {refit.data.map((r) => (r.ok ? `${r.fibreClass}: ${r.dyes} dyes from ${r.dyeings} dyeings` : `${r.fibreClass}: ${r.message}`)).join(" · ")}
        </Notice>
      )}
      {refit.error && <Notice tone="danger">{refit.error.message}</Notice>}
      {q.data?.length === 0 && <EmptyState title="No profiles yet">Dye a calibration trial (one dye on a measured base) and take its reading.</EmptyState>}
      {classes.map((fc) => (
        <section key={fc}>
          <h2 className="text-xl">On {fc}</h2>
          <ul className="mt-2 divide-y divide-rule rounded-lg border border-rule bg-sheet">
            {q.data!
              .filter((p) => p.fibreClass === fc)
              .map((p) => (
                <li key={p.id} className="flex items-center gap-3 p-3">
                  <Chip hex={p.displayHex ?? "#ddd"} size="h-9 w-9" label={p.dyeName} />
                  <div className="min-w-0 flex-1">
                    <p className="font-medium">{p.dyeName}</p>
                    <p className="tabular text-sm text-ink-soft">
                      {p.nDyeings} dyeing{p.nDyeings === 1 ? "" : "s"} · {fitWords(p.meanDe00)} (mean ΔE00 {p.meanDe00.toFixed(1)}, worst {p.maxDe00.toFixed(1)}) · version {p.modelVersion}
                    </p>
                  </div>
                </li>
              ))}
          </ul>
        </section>
      ))}
    </div>
  );
}
