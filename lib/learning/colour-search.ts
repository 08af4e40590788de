import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import { deltaE00, hexToLab, type Lab } from "@/colour";
import type { Studio } from "@/entities";
import { de00LowerBound, radiusFor } from "./colour-bound";

export interface ColourMatch {
  kind: "reading" | "colourway";
  id: string;
  trialId: string;
  title: string;
  lab: Lab;
  de00: number;
}

/** Largest lightness weight SL of CIEDE2000 (at L̄ = 0 or 100): 1 + 0.015·2500/√2520. */
const SL_MAX = 1 + (0.015 * 2500) / Math.sqrt(2520);

interface Row {
  id: string;
  trial_id: string;
  l: number;
  a: number;
  b: number;
}

/**
 * The studio's readings nearest a colour in ΔE00, exactly as a full scan would rank them: a box
 * around the colour is read through the (studio, L*, a*, b*) index and widened until the k-th best
 * difference is below what any colour outside the box could reach (see colour-bound.ts).
 */
export async function nearestReadings(em: EntityManager, studioId: string, target: Lab, k: number): Promise<ColourMatch[]> {
  const c1 = Math.hypot(target.a, target.b);
  const conn = em.getConnection();
  // Half-widths of the box: in L* (outside it, ΔE00 > ΔL*/1.75, as SL ≤ 1.75) and in a*, b*.
  let rL = 4;
  let r = 8;
  for (;;) {
    const rows = await conn.execute<Row[]>(
      `select id, trial_id, l, a, b from readings
       where studio_id = ? and l between ? and ? and a between ? and ? and b between ? and ?`,
      [studioId, target.L - rL, target.L + rL, target.a - r, target.a + r, target.b - r, target.b + r],
    );
    const scored = rows
      .map((x) => ({ x, d: deltaE00(target, { L: x.l, a: x.a, b: x.b }) }))
      .sort((p, q) => p.d - q.d || (p.x.id < q.x.id ? -1 : 1))
      .slice(0, k);
    const everything = r > 400 && rL > 100; // the box then holds every possible CIELAB colour
    // No colour outside the box is closer than this. A box spanning all of L* (0–100) leaves no
    // colour outside it in L*, so that side sets no limit.
    const settled = Math.min(rL > 100 ? Infinity : rL / SL_MAX, r > 400 ? Infinity : de00LowerBound(r, c1));
    if (everything || (scored.length === k && scored[k - 1].d < settled)) {
      const titles = await conn.execute<{ id: string; title: string }[]>(
        `select id, title from trials where id in (${scored.map(() => "?").join(",") || "null"})`,
        scored.map((s) => s.x.trial_id),
      );
      const title = new Map(titles.map((t) => [t.id, t.title]));
      return scored.map(({ x, d }) => ({
        kind: "reading",
        id: x.id,
        trialId: x.trial_id,
        title: title.get(x.trial_id) ?? "",
        lab: { L: x.l, a: x.a, b: x.b },
        de00: d,
      }));
    }
    // With k candidates, jump straight to the box that settles their k-th difference (a larger box
    // can only lower it); with fewer, look twice as far.
    const [lastL, last] = [rL, r];
    if (scored.length === k) {
      const d = scored[k - 1].d;
      rL = Math.max(rL, Math.min(d * SL_MAX * 1.001, 101));
      r = Math.max(r, Math.min(radiusFor(d, c1) * 1.001, 401));
    }
    if (rL === lastL && r === last) {
      rL = Math.min(rL * 2, 101);
      r = Math.min(r * 2, 401);
    }
  }
}

/** Colourways nearest a colour (a studio has few: compared one by one; plain rows, no entities). */
export async function nearestColourways(em: EntityManager, studio: Studio, target: Lab, k: number): Promise<ColourMatch[]> {
  const list = await em.getConnection().execute<{ id: string; name: string; source_trial_id: string; target_l: number; target_a: number; target_b: number }[]>(
    "select id, name, source_trial_id, target_l, target_a, target_b from colourways where studio_id = ? and status <> 'retired'",
    [studio.id],
  );
  return list
    .map((c) => {
      const lab = { L: c.target_l, a: c.target_a, b: c.target_b };
      return { kind: "colourway" as const, id: c.id, trialId: c.source_trial_id, title: c.name, lab, de00: deltaE00(target, lab) };
    })
    .sort((p, q) => p.de00 - q.de00)
    .slice(0, k);
}

export async function searchByColour(
  em: EntityManager,
  studio: Studio,
  q: { L?: number; a?: number; b?: number; hex?: string; limit: number },
) {
  const target: Lab = q.hex ? hexToLab(q.hex.startsWith("#") ? q.hex : `#${q.hex}`) : { L: q.L!, a: q.a!, b: q.b! };
  const [readings, colourways] = await Promise.all([nearestReadings(em, studio.id, target, q.limit), nearestColourways(em, studio, target, q.limit)]);
  return { target, readings, colourways };
}
