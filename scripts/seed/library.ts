// The demo studio's libraries: invented yarn bases, dyes and stock solutions.
// Idempotent: each item is found by name (stocks by dye and powder lot) before it is created.
// No Colour Index names here: the demo dyes are made up, so no generic name would be true of them.
import type { EntityManager } from "@mikro-orm/postgresql";
import {
  type Dye,
  type FibrePart,
  type StockSolution,
  type WeightClass,
  type YarnBase,
  DyeSchema,
  StockSolutionSchema,
  YarnBaseSchema,
} from "../../entities/library";
import type { Studio } from "../../entities/studio";

interface BaseSeed {
  name: string;
  fibres: FibrePart[];
  superwash: boolean;
  weightClass: WeightClass;
  metresPer100g: number | null;
  notes: string;
}

export const demoBases: BaseSeed[] = [
  {
    name: "Skerry Sock",
    fibres: [{ fibre: "merino", pct: 75 }, { fibre: "nylon", pct: 25 }],
    superwash: true,
    weightClass: "fingering",
    metresPer100g: 420,
    notes: "The everyday sock base. Takes colour fast; the nylon can come out a touch darker.",
  },
  {
    name: "Heathland DK",
    fibres: [{ fibre: "wool", pct: 100 }],
    superwash: false,
    weightClass: "dk",
    metresPer100g: 230,
    notes: "Lustrous longwool, not superwash. Cool in the pot; it felts if shocked.",
  },
  {
    name: "Moonrise Silk Lace",
    fibres: [{ fibre: "merino", pct: 55 }, { fibre: "silk", pct: 45 }],
    superwash: false,
    weightClass: "lace",
    metresPer100g: 800,
    notes: "The silk takes colour paler and shinier than the wool beside it.",
  },
  {
    name: "Saltmarsh Blend",
    fibres: [{ fibre: "wool", pct: 70 }, { fibre: "cotton", pct: 30 }],
    superwash: false,
    weightClass: "sport",
    metresPer100g: 260,
    notes: "Bought for a heathered look: the cotton stays light under acid dyes.",
  },
  {
    name: "Breakwater Aran",
    fibres: [{ fibre: "superwash wool", pct: 100 }],
    superwash: true,
    weightClass: "aran",
    metresPer100g: 165,
    notes: "",
  },
];

interface DyeSeed {
  name: string;
  dyeClass: Dye["dyeClass"];
  form: Dye["form"];
  displayHex: string;
  /** Placeholder addresses on the reserved example.com domain: the demo dyes are invented. */
  sdsUrl?: string;
  notes: string;
}

// Chips of the dyes the calibration series uses (scripts/seed/calibration.ts STAND_INS) agree with
// their invented spectra: Rosehip and Harbour Teal show what they give at 1 % DOS on the white base
// (#a83a98, #008bcb), so a chip matches what predictions show; Marigold's was already close, and
// Slate Black keeps a black chip, as it dyes at its working depth of 4 % or more.
export const demoDyes: DyeSeed[] = [
  { name: "Harbour Teal", dyeClass: "acid", form: "powder", sdsUrl: "https://example.com/sds/harbour-teal.pdf", displayHex: "#008bcb", notes: "Strikes early; add last in a mix." },
  { name: "Rosehip", dyeClass: "acid", form: "powder", sdsUrl: "https://example.com/sds/rosehip.pdf", displayHex: "#a83a98", notes: "A cool pink; leans violet at depth." },
  { name: "Marigold", dyeClass: "acid", form: "powder", sdsUrl: "https://example.com/sds/marigold.pdf", displayHex: "#e3a21a", notes: "Slow to exhaust at pale depths: hold the heat." },
  { name: "Slate Black", dyeClass: "acid", form: "powder", sdsUrl: "https://example.com/sds/slate-black.pdf", displayHex: "#2b2f33", notes: "Needs 4 % or more for a true black." },
  { name: "Heather Violet", dyeClass: "acid", form: "powder", displayHex: "#6b4a8c", notes: "" },
  {
    name: "Grocery Green (food colouring)",
    dyeClass: "food",
    form: "liquid",
    displayHex: "#3f8f3a",
    notes: "Supermarket liquid colouring; breaks into blue and yellow when the acid goes in late.",
  },
];

interface StockSeed {
  dye: string;
  concentrationPct: number;
  definition: StockSolution["definition"];
  volumeMl: number;
  mixedDaysAgo: number;
  powderLot: string;
  notes: string;
}

export const demoStocks: StockSeed[] = [
  { dye: "Harbour Teal", concentrationPct: 1, definition: "to-volume", volumeMl: 500, mixedDaysAgo: 9, powderLot: "HT-2611", notes: "" },
  { dye: "Rosehip", concentrationPct: 1, definition: "to-volume", volumeMl: 500, mixedDaysAgo: 16, powderLot: "RH-2608", notes: "" },
  { dye: "Marigold", concentrationPct: 0.5, definition: "to-volume", volumeMl: 1000, mixedDaysAgo: 23, powderLot: "MG-2609", notes: "Half strength for pale yellows." },
  { dye: "Heather Violet", concentrationPct: 1, definition: "in-water", volumeMl: 250, mixedDaysAgo: 5, powderLot: "HV-2610", notes: "1 g in 100 g of water." },
  { dye: "Slate Black", concentrationPct: 1, definition: "to-volume", volumeMl: 500, mixedDaysAgo: 97, powderLot: "SB-2604", notes: "A little sediment at the bottom; shake well." },
];

export interface DemoLibrary {
  bases: Record<string, YarnBase>;
  dyes: Record<string, Dye>;
  stocks: StockSolution[];
}

function daysAgo(n: number): string {
  return new Date(Date.now() - n * 86_400_000).toISOString().slice(0, 10);
}

/** Adds the demo bases, dyes and stock solutions to a studio, or finds them when they exist. */
export async function seedLibrary(em: EntityManager, studio: Studio): Promise<DemoLibrary> {
  const bases: Record<string, YarnBase> = {};
  for (const b of demoBases) {
    bases[b.name] = (studio.id ? await em.findOne(YarnBaseSchema, { studio, name: b.name }) : null) ?? em.create(YarnBaseSchema, { studio, ...b });
  }
  const dyes: Record<string, Dye> = {};
  for (const d of demoDyes) {
    dyes[d.name] = (studio.id ? await em.findOne(DyeSchema, { studio, name: d.name }) : null) ?? em.create(DyeSchema, { studio, ...d });
  }
  await em.flush();
  const stocks: StockSolution[] = [];
  for (const s of demoStocks) {
    const dye = dyes[s.dye];
    const found = await em.findOne(StockSolutionSchema, { studio, dye, powderLot: s.powderLot });
    stocks.push(
      found ??
        em.create(StockSolutionSchema, {
          studio,
          dye,
          concentrationPct: s.concentrationPct,
          definition: s.definition,
          volumeMl: s.volumeMl,
          mixedOn: daysAgo(s.mixedDaysAgo),
          powderLot: s.powderLot,
          notes: s.notes,
        }),
    );
  }
  await em.flush();
  return { bases, dyes, stocks };
}
