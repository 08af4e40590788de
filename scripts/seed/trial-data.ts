// The demo trials as data: an invented notebook of a few weeks at the dye pots. Amounts are written
// as the dyer entered them; scripts/seed/trials.ts turns them into depth of shade.
import type { Layer, Trial } from "../../entities/trial";
import type { Role } from "../../entities/studio";
import type { AmountUnit } from "../../lib/schemas/trial";

export type DyeLine = { dye: string; amount: number; unit: AmountUnit; stock?: string };
export type LayerSeed = Omit<Partial<Layer>, "dyes" | "trial"> & { method: Layer["method"]; dyes?: DyeLine[] };
export interface TrialSeed {
  key: string;
  title: string;
  author: Role;
  base: string;
  fibreWeightG: number;
  status: Trial["status"];
  tags: string[];
  notes: string;
  daysAgo: number;
  copyOf?: string;
  layers: LayerSeed[];
}

export const demoTrials: TrialSeed[] = [
  {
    key: "green-dip",
    title: "Grocery Green dip, left to break",
    author: "owner",
    base: "Heathland DK",
    fibreWeightG: 102,
    status: "done",
    tags: ["gradient", "break", "food colouring"],
    notes: "Wanted to see how far the green splits when the acid goes in late.\n\nFour sections, dipped tips first, each a little shallower than the one before.",
    daysAgo: 24,
    layers: [
      {
        method: "dip",
        dyes: [{ dye: "Grocery Green (food colouring)", amount: 6, unit: "g" }],
        acid: { kind: "vinegar", amount: 50, ph: null },
        waterL: 1.5,
        temperatureC: 85,
        minutes: 30,
        gradient: { sections: 4, depths: [1, 0.7, 0.4, 0.15] },
        rinseNote: "First rinse ran a little blue, then clear.",
        bled: true,
        observations: "Blue broke out at the tips and yellow crept up the middle two sections; the top section is a soft lime. Vinegar went in after ten minutes, so the split is wide.",
      },
    ],
  },
  {
    key: "rosehip-base",
    title: "Rosehip sock, violet rubbed over",
    author: "dyer",
    base: "Skerry Sock",
    fibreWeightG: 100,
    status: "done",
    tags: ["over-dye", "dry rub"],
    notes: "Layer 1 dyed, washed and dried overnight before the violet went on dry.",
    daysAgo: 19,
    layers: [
      {
        method: "immersion",
        dyes: [{ dye: "Rosehip", amount: 100, unit: "ml", stock: "RH-2608" }],
        acid: { kind: "vinegar", amount: 52, ph: 4.7 },
        waterL: 3,
        temperatureC: 90,
        minutes: 40,
        setting: { method: "none", minutes: null },
        rinseNote: "Clear from the first rinse.",
        bled: false,
        observations: "Even mid pink. The bath cleared at about 25 minutes; held the heat another 15.",
      },
      {
        method: "dry",
        dyes: [{ dye: "Heather Violet", amount: 2, unit: "tbsp", stock: "HV-2610" }],
        acid: { kind: "citric", amount: 2, ph: null },
        coverage: 0.35,
        setting: { method: "steam", minutes: 30 },
        rinseNote: "Slight violet in the first soak.",
        bled: true,
        observations: "Violet sits in patches where it was rubbed in; the pink shows through between them. A plum where they overlap.",
      },
    ],
  },
  {
    key: "slate-speckle",
    title: "Slate and teal speckle on Breakwater",
    author: "dyer",
    base: "Breakwater Aran",
    fibreWeightG: 98,
    status: "in-progress",
    tags: ["speckle"],
    notes: "Damp, acidified skein laid flat; powder flicked from a dry brush.",
    daysAgo: 6,
    layers: [
      {
        method: "speckle",
        dyes: [
          { dye: "Slate Black", amount: 0.3, unit: "g" },
          { dye: "Harbour Teal", amount: 0.1, unit: "g" },
        ],
        acid: { kind: "vinegar", amount: 30, ph: null },
        coverage: 0.15,
        setting: { method: "steam", minutes: 20 },
        observations: "",
      },
    ],
  },
  {
    key: "moss-immersion",
    title: "Moss: teal and marigold together",
    author: "owner",
    base: "Moonrise Silk Lace",
    fibreWeightG: 100,
    status: "done",
    tags: ["two-dye", "green"],
    notes: "A mossy green from two stocks in one bath.",
    daysAgo: 15,
    layers: [
      {
        method: "immersion",
        dyes: [
          { dye: "Harbour Teal", amount: 0.6, unit: "dos", stock: "HT-2611" },
          { dye: "Marigold", amount: 80, unit: "ml", stock: "MG-2609" },
        ],
        acid: { kind: "vinegar", amount: 50, ph: 4.6 },
        waterL: 4,
        temperatureC: 88,
        minutes: 40,
        rinseNote: "Clear.",
        bled: false,
        observations: "A mossy green. The silk came out lighter and yellower than the merino beside it; the teal struck first.",
      },
    ],
  },
  {
    key: "moss-copy",
    title: "Moss on the sock base",
    author: "dyer",
    base: "Skerry Sock",
    fibreWeightG: 200,
    status: "in-progress",
    tags: ["two-dye", "green"],
    notes: "",
    daysAgo: 3,
    copyOf: "moss-immersion",
    layers: [
      {
        method: "immersion",
        dyes: [
          { dye: "Harbour Teal", amount: 0.6, unit: "dos", stock: "HT-2611" },
          { dye: "Marigold", amount: 160, unit: "ml", stock: "MG-2609" },
        ],
        acid: { kind: "vinegar", amount: 100, ph: null },
        waterL: 8,
        temperatureC: 88,
        minutes: 40,
      },
    ],
  },
  {
    key: "failed-rosehip",
    title: "Deep rosehip on the blend — bath never cleared",
    author: "dyer",
    base: "Saltmarsh Blend",
    fibreWeightG: 100,
    status: "done",
    tags: ["failed"],
    notes: "Aimed for a deep red. Not a keeper.",
    daysAgo: 11,
    layers: [
      {
        method: "immersion",
        dyes: [{ dye: "Rosehip", amount: 3, unit: "dos", stock: "RH-2608" }],
        acid: { kind: "vinegar", amount: 20, ph: 5.6 },
        waterL: 4,
        temperatureC: 80,
        minutes: 30,
        rinseNote: "Bled pink through four rinses.",
        bled: true,
        observations: "The bath did not exhaust: still deep pink after 30 minutes at 80 °C. Too little vinegar and too cool. Next time about 50 ml of vinegar, bring it to 90 °C and hold 20 minutes after it clears. The cotton stayed pale, as expected.",
      },
    ],
  },
  {
    key: "planned-violet",
    title: "Violet gradient over teal",
    author: "owner",
    base: "Skerry Sock",
    fibreWeightG: 104,
    status: "planned",
    tags: ["gradient", "over-dye"],
    notes: "For the autumn club: teal first, then a three-step violet dip from one end.",
    daysAgo: 1,
    layers: [
      {
        method: "dip",
        dyes: [{ dye: "Heather Violet", amount: 0.5, unit: "dos", stock: "HV-2610" }],
        acid: { kind: "vinegar", amount: 50, ph: null },
        waterL: 2,
        temperatureC: 85,
        minutes: 20,
        gradient: { sections: 3, depths: [1, 0.55, 0.2] },
      },
    ],
  },
];
