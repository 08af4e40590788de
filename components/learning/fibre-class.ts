// Client-safe copy of the server's fibre-class rule (lib/learning/fibre-class.ts): the live prediction must pick the same profiles.

/**
 * The fibre class a dye profile belongs to. Dyes behave alike on the same class: nylon takes
 * acid dye faster and deeper than wool, silk shows colours lighter and brighter
 * [practice]. Blends with a quarter or less of another protein fibre count with wool.
 */
export function fibreClassOf(fibres: { fibre: string; pct: number }[] | null | undefined): string {
  if (!fibres?.length) return "wool";
  const share = (names: string[]) => fibres.filter((f) => names.includes(f.fibre)).reduce((s, f) => s + f.pct, 0);
  if (share(["silk"]) >= 50) return "silk";
  if (share(["nylon"]) >= 15) return "wool-nylon";
  if (share(["cotton", "linen", "viscose", "bamboo"]) >= 50) return "cellulose";
  return "wool";
}
