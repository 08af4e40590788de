import "server-only";
import { type DyeMethod, NONLINEAR_METHODS, scaleRecipe } from "@/colour/arithmetic";
import type { DyeClass, Fibre } from "@/entities/library";
import type { Layer } from "@/entities/trial";
import type { TrialParts } from "./dto";
import type { TrialWarning } from "./types";

// Warnings in context (DOMAIN.md, "Fibres and dye classes" and "Quality and repeatability"): shown
// beside the trial, dismissible, never blocking a save.

const PROTEIN: readonly Fibre[] = ["wool", "superwash wool", "merino", "silk", "mohair", "alpaca", "cashmere", "yak"];
const CELLULOSE: readonly Fibre[] = ["cotton", "linen", "viscose", "bamboo"];

/** Fibres a dye class will not colour (acid and food colouring: only protein and nylon take them). */
const NOT_TAKEN: Record<DyeClass, readonly Fibre[]> = {
  acid: [...CELLULOSE, "acrylic", "polyester"],
  food: [...CELLULOSE, "acrylic", "polyester"],
  // Fibre-reactive dyes are for cellulose and, with caveats, protein; not for acrylic or polyester.
  reactive: ["acrylic", "polyester"],
  other: [],
};
const CLASS_WORDS: Record<DyeClass, string> = {
  acid: "acid dyes",
  food: "food colouring (a blend of acid dyes)",
  reactive: "fibre-reactive dyes",
  other: "",
};

/** A hold at or above this, for longer than SUPERWASH_MAX_MIN, counts as a long boil [common practice:
 *  hobby immersion runs 85–95 °C for 30–45 min, DOMAIN.md]. */
const SUPERWASH_BOIL_C = 95;
const SUPERWASH_MAX_MIN = 45;

const NONLINEAR_AS: Partial<Record<Layer["method"], DyeMethod>> = {
  kettle: "kettle",
  "hand-paint": "hand-paint",
  speckle: "speckle",
  dry: "dry",
};

const DAY_MS = 86_400_000;
const fmt = (n: number) => (Math.round(n * 10) / 10).toString();

function fibreWarnings(p: TrialParts, layer: Layer, n: number): TrialWarning[] {
  if (!p.base) return [];
  const classes = new Set(layer.dyes.map((d) => p.lib.dyes.get(d.dyeId)?.dyeClass).filter((c): c is DyeClass => !!c));
  const out: TrialWarning[] = [];
  for (const cls of classes) {
    const pale = p.base.fibres.filter((f) => f.pct > 0 && NOT_TAKEN[cls].includes(f.fibre));
    if (pale.length === 0) continue;
    const what = pale.map((f) => `${fmt(f.pct)} % ${f.fibre}`).join(" and ");
    out.push({
      key: `fibre-dye:${layer.id}:${cls}`,
      kind: "fibre-dye",
      layerId: layer.id,
      message: `Layer ${n}: the ${what} in ${p.base.name} will stay pale — ${CLASS_WORDS[cls]} do not take on ${pale.length > 1 ? "those fibres" : pale[0].fibre}.`,
    });
  }
  return out;
}

function superwashWarning(p: TrialParts, layer: Layer, n: number): TrialWarning[] {
  const b = p.base;
  if (!b || !(b.superwash || b.fibres.some((f) => f.fibre === "superwash wool"))) return [];
  const hot = (layer.temperatureC ?? 0) >= SUPERWASH_BOIL_C && (layer.minutes ?? 0) > SUPERWASH_MAX_MIN;
  const simmer = layer.setting.method === "simmer" && (layer.setting.minutes ?? 0) > SUPERWASH_MAX_MIN;
  if (!hot && !simmer) return [];
  const desc = hot ? `${fmt(layer.minutes ?? 0)} minutes at ${fmt(layer.temperatureC ?? 0)} °C` : `a ${fmt(layer.setting.minutes ?? 0)}-minute simmer`;
  return [{
    key: `superwash-boil:${layer.id}`,
    kind: "superwash-boil",
    layerId: layer.id,
    message: `Layer ${n}: ${b.name} is superwash and this layer holds ${desc}. Long boiling harms superwash wool: keep below a boil and only as long as the dye needs.`,
  }];
}

function stockWarnings(p: TrialParts, layer: Layer, n: number): TrialWarning[] {
  const out: TrialWarning[] = [];
  // A finished trial is judged on the day the layer was logged; an open one on today.
  const when = p.trial.status === "done" ? layer.createdAt.getTime() : Date.now();
  for (const d of layer.dyes) {
    const dye = p.lib.dyes.get(d.dyeId);
    if (!dye) {
      out.push({ key: `missing-dye:${layer.id}:${d.dyeId}`, kind: "missing-dye", layerId: layer.id, message: `Layer ${n}: one dye is no longer in the library; its amount is kept as ${fmt(d.dosPct)} % DOS.` });
      continue;
    }
    const stock = d.stockId ? p.lib.stocks.get(d.stockId) : undefined;
    if (!stock) continue;
    const mixed = Date.parse(typeof stock.mixedOn === "string" ? stock.mixedOn : (stock.mixedOn as Date).toISOString());
    const age = Math.floor((when - mixed) / DAY_MS);
    if (age <= p.shelfLifeDays) continue;
    out.push({
      key: `stock-age:${layer.id}:${stock.id}`,
      kind: "stock-age",
      layerId: layer.id,
      message: `Layer ${n}: the ${fmt(stock.concentrationPct)} % stock of ${dye.name} is ${age} days old, past the studio's shelf life of ${p.shelfLifeDays} days. Old stock can weaken; mix a fresh one for work you mean to repeat.`,
    });
  }
  return out;
}

function nonlinearWarning(p: TrialParts, layer: Layer, n: number): TrialWarning[] {
  const method = NONLINEAR_AS[layer.method];
  const from = p.sourceFibreG;
  if (!method || !NONLINEAR_METHODS.has(method) || from === null || Math.abs(from - p.trial.fibreWeightG) < 1e-9) return [];
  const { warning } = scaleRecipe([], from, p.trial.fibreWeightG, method);
  if (!warning) return [];
  return [{
    key: `nonlinear:${layer.id}`,
    kind: "nonlinear",
    layerId: layer.id,
    message: `Layer ${n} was scaled from ${fmt(from)} g to ${fmt(p.trial.fibreWeightG)} g. ${warning}`,
  }];
}

/** Every warning for a trial, in layer order. */
export function trialWarnings(p: TrialParts): TrialWarning[] {
  return p.layers.flatMap((layer, i) => [
    ...fibreWarnings(p, layer, i + 1),
    ...superwashWarning(p, layer, i + 1),
    ...stockWarnings(p, layer, i + 1),
    ...nonlinearWarning(p, layer, i + 1),
  ]);
}
