// The demo studio's trials: an invented notebook of a few weeks at the dye pots — a breaking dip
// gradient, a dry rub over a dyed skein, a speckle, a two-dye immersion (and its copy onto another
// base), a bath that never exhausted, and one planned. Skipped when the studio has trials already.
import type { EntityManager } from "@mikro-orm/postgresql";
import type { Dye, StockSolution, YarnBase } from "../../entities/library";
import type { Role, Studio } from "../../entities/studio";
import { type LayerDye, LayerSchema, type Trial, TrialSchema } from "../../entities/trial";
import type { User } from "../../entities/user";
import { dosFromEntered } from "../../lib/trials/amounts";
import { docFromText, notesText } from "../../lib/trials/notes";
import type { DemoLibrary } from "./library";
import { type DyeLine, demoTrials as trials } from "./trial-data";

function dyesFor(lines: DyeLine[], fibreG: number, lib: DemoLibrary): LayerDye[] {
  return lines.map((l) => {
    const dye: Dye | undefined = lib.dyes[l.dye];
    if (!dye) throw new Error(`The demo library has no dye called ${l.dye}.`);
    const stock: StockSolution | undefined = l.stock ? lib.stocks.find((s) => s.powderLot === l.stock) : undefined;
    if (l.stock && !stock) throw new Error(`The demo library has no stock with powder lot ${l.stock}.`);
    const entered = { value: l.amount, unit: l.unit };
    return { dyeId: dye.id, stockId: stock?.id ?? null, dosPct: dosFromEntered(entered, fibreG, stock ?? null), entered };
  });
}

/** Adds the demo trials unless the studio has trials already; returns how many were added. */
export async function seedTrials(em: EntityManager, studio: Studio, users: Record<Role, User>, library: DemoLibrary): Promise<number> {
  if ((await em.count(TrialSchema, { studio })) > 0) return 0;
  const made = new Map<string, Trial>();
  const dates: [Trial, Date][] = [];
  for (const t of trials) {
    const base: YarnBase | undefined = library.bases[t.base];
    if (!base) throw new Error(`The demo library has no base called ${t.base}.`);
    const notes = t.notes ? docFromText(t.notes) : null;
    const trial = em.create(TrialSchema, {
      studio,
      author: users[t.author],
      title: t.title,
      base,
      fibreWeightG: t.fibreWeightG,
      status: t.status,
      tags: t.tags,
      notes,
      notesText: notesText(notes),
      copiedFrom: t.copyOf ? made.get(t.copyOf) : null,
    });
    t.layers.forEach((l, i) =>
      em.create(LayerSchema, { acid: { kind: "vinegar" }, setting: { method: "none" }, ...l, trial, position: i, dyes: dyesFor(l.dyes ?? [], t.fibreWeightG, library) }),
    );
    made.set(t.key, trial);
    dates.push([trial, new Date(Date.now() - t.daysAgo * 86_400_000)]);
  }
  await em.flush();
  // Spread the trials over the past weeks (the entity hooks stamp "now" on insert).
  for (const [trial, when] of dates) {
    await em.getConnection().execute("update trials set created_at = ?, updated_at = ? where id = ?", [when, when, trial.id], "run", em.getTransactionContext());
    await em.getConnection().execute("update layers set created_at = ?, updated_at = ? where trial_id = ?", [when, when, trial.id], "run", em.getTransactionContext());
  }
  return trials.length;
}
