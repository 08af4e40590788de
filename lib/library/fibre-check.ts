// Which fibres of a base will take which dye class, as plain warnings for a person.
// Pure and free of server code: the trial page (client) and the server both use it.
// The rules follow DOMAIN.md "Fibres and dye classes" (common practice, no single source):
// acid dyes and food colouring (a blend of acid dyes) dye protein fibres and nylon, not
// cellulose, acrylic or polyester; fibre-reactive dyes are for cellulose (protein with caveats);
// nylon saturates sooner than wool; superwash wool strikes fast and long boiling harms it;
// heat, agitation and temperature shock felt non-superwash wool.
import type { DyeClass, Fibre, FibrePart } from "@/entities/library";

export type FibreGroup = "protein" | "nylon" | "cellulose" | "acrylic" | "polyester" | "unknown";

const GROUP: Record<Fibre, FibreGroup> = {
  wool: "protein",
  "superwash wool": "protein",
  merino: "protein",
  silk: "protein",
  mohair: "protein",
  alpaca: "protein",
  cashmere: "protein",
  yak: "protein",
  nylon: "nylon",
  cotton: "cellulose",
  linen: "cellulose",
  viscose: "cellulose",
  bamboo: "cellulose",
  acrylic: "acrylic",
  polyester: "polyester",
  other: "unknown",
};

/** Animal hair that felts; silk does not. */
const FELTING: ReadonlySet<Fibre> = new Set(["wool", "merino", "mohair", "alpaca", "cashmere", "yak"]);

export type FibreWarningKind = "wont-take" | "caveat" | "uneven" | "superwash" | "felting";

export interface FibreWarning {
  kind: FibreWarningKind;
  /** "warning" changes the result; "note" is care advice. */
  level: "warning" | "note";
  message: string;
  /** The fibres the warning is about. */
  fibres: Fibre[];
}

export function fibreGroup(fibre: Fibre): FibreGroup {
  return GROUP[fibre] ?? "unknown";
}

const pct = (n: number) => `${Math.round(n * 10) / 10} %`;
const share = (parts: FibrePart[]) => parts.map((p) => `${pct(p.pct)} ${p.fibre}`).join(" and ");
const doesNotDye: Record<DyeClass, string> = {
  acid: "acid dyes do not dye",
  food: "food colouring (a blend of acid dyes) does not dye",
  reactive: "fibre-reactive dyes do not dye",
  other: "this dye does not dye",
};
const groupWords: Record<FibreGroup, string> = {
  protein: "protein fibres",
  nylon: "nylon",
  cellulose: "cellulose",
  acrylic: "acrylic",
  polyester: "polyester",
  unknown: "that fibre",
};

/** Groups a dye class leaves pale, and groups it takes only with caveats. */
function affinity(dyeClass: DyeClass): { none: FibreGroup[]; caveat: FibreGroup[] } {
  switch (dyeClass) {
    case "acid":
    case "food":
      return { none: ["cellulose", "acrylic", "polyester"], caveat: [] };
    case "reactive":
      return { none: ["acrylic", "polyester"], caveat: ["protein", "nylon"] };
    default:
      return { none: [], caveat: [] };
  }
}

/**
 * Warnings for dyeing a base's fibres with one dye class, e.g. "The 30 % cotton will stay pale:
 * acid dyes do not dye cellulose." A base marked superwash (or listing superwash wool) adds the
 * superwash note; non-superwash animal hair adds the felting note.
 */
export function fibreWarnings(fibres: FibrePart[], dyeClass: DyeClass, opts: { superwash?: boolean } = {}): FibreWarning[] {
  const out: FibreWarning[] = [];
  const { none, caveat } = affinity(dyeClass);

  // One warning per fibre group that stays pale, naming each fibre and its share.
  for (const group of none) {
    const parts = fibres.filter((f) => fibreGroup(f.fibre) === group && f.pct > 0);
    if (!parts.length) continue;
    const all = parts.reduce((s, p) => s + p.pct, 0) >= 100;
    out.push({
      kind: "wont-take",
      level: "warning",
      message: all
        ? `This base will stay undyed: ${doesNotDye[dyeClass]} ${groupWords[group]}.`
        : `The ${share(parts)} will stay pale: ${doesNotDye[dyeClass]} ${groupWords[group]}.`,
      fibres: parts.map((p) => p.fibre),
    });
  }
  const caveatParts = fibres.filter((f) => caveat.includes(fibreGroup(f.fibre)) && f.pct > 0);
  if (caveatParts.length) {
    out.push({
      kind: "caveat",
      level: "warning",
      message: `Fibre-reactive dyes are made for cellulose; on the ${share(caveatParts)} they work only with the maker's protein-fibre method, and colours may differ.`,
      fibres: caveatParts.map((p) => p.fibre),
    });
  }

  // Nylon beside wool-like fibres takes acid dye first: sock blends can come out uneven.
  const nylon = fibres.find((f) => f.fibre === "nylon" && f.pct > 0);
  const protein = fibres.some((f) => fibreGroup(f.fibre) === "protein" && f.pct > 0);
  if ((dyeClass === "acid" || dyeClass === "food") && nylon && protein) {
    out.push({
      kind: "uneven",
      level: "note",
      message: `The ${pct(nylon.pct)} nylon takes up dye sooner than the wool: expect some unevenness, more so in pale shades.`,
      fibres: ["nylon"],
    });
  }

  const swParts = fibres.filter((f) => f.fibre === "superwash wool" && f.pct > 0);
  const felters = fibres.filter((f) => FELTING.has(f.fibre) && f.pct > 0);
  const superwash = !!opts.superwash || swParts.length > 0;
  if (superwash && swParts.length + felters.length > 0) {
    out.push({
      kind: "superwash",
      level: "note",
      message: "Superwash wool strikes fast and bright; long boiling harms it.",
      fibres: [...swParts, ...felters].map((f) => f.fibre),
    });
  } else if (!superwash && felters.length) {
    out.push({
      kind: "felting",
      level: "note",
      message: "Non-superwash wool felts with heat, agitation and sudden temperature changes: stir gently, cool in the bath and rinse at a similar temperature.",
      fibres: felters.map((f) => f.fibre),
    });
  }
  return out;
}
