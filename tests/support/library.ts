// Library fixtures (yarn bases, dyes, stock solutions) for integration tests, written through the ORM.
import { DyeSchema, StockSolutionSchema, YarnBaseSchema, type Dye, type StockSolution, type YarnBase } from "@/entities/library";
import { getEm } from "@/lib/db";

type BaseFields = Partial<Omit<YarnBase, "id" | "studio" | "createdAt" | "version">>;
type DyeFields = Partial<Omit<Dye, "id" | "studio" | "createdAt" | "version">>;
type StockFields = Partial<Omit<StockSolution, "id" | "studio" | "dye" | "createdAt" | "version">>;

export async function makeBase(studioId: string, name: string, fields: BaseFields = {}): Promise<YarnBase> {
  const em = await getEm();
  const b = em.create(YarnBaseSchema, {
    studio: studioId,
    name,
    fibres: [{ fibre: "wool", pct: 100 }],
    weightClass: "dk",
    ...fields,
  });
  await em.flush();
  return b;
}

export async function makeDye(studioId: string, name: string, fields: DyeFields = {}): Promise<Dye> {
  const em = await getEm();
  const d = em.create(DyeSchema, { studio: studioId, name, dyeClass: "acid", form: "powder", ...fields });
  await em.flush();
  return d;
}

export async function makeStock(studioId: string, dyeId: string, fields: StockFields = {}): Promise<StockSolution> {
  const em = await getEm();
  const s = em.create(StockSolutionSchema, {
    studio: studioId,
    dye: dyeId,
    concentrationPct: 1,
    definition: "to-volume",
    volumeMl: 500,
    mixedOn: daysAgo(0),
    ...fields,
  });
  await em.flush();
  return s;
}

/** The UTC calendar day `n` days before today, as YYYY-MM-DD. */
export function daysAgo(n: number): string {
  const d = new Date(Date.now() - n * 86_400_000);
  return d.toISOString().slice(0, 10);
}
