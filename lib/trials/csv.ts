import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import type { Studio } from "@/entities/studio";
import { METHOD_LABELS, STATUS_LABELS, type TrialQuery, type TrialStatus } from "@/lib/schemas/trial";
import { layerDto, loadLibrary } from "./dto";
import { loadInOrder, matchingIds } from "./query";
import type { LayerDto } from "./types";

// CSV export of the trial list (same search and filters): one row per layer, the trial's columns
// repeated, so a spreadsheet can filter by dye or method. RFC 4180 quoting, CRLF line ends, a
// UTF-8 byte-order mark so spreadsheet programs read °C and accents.

export const CSV_HEADER = [
  "Trial", "Status", "Started", "Updated", "Author", "Base", "Fibre weight (g)", "Tags",
  "Layer", "Method", "Dyes", "Acid", "Water (l)", "Liquor ratio (1:N)", "Temperature (°C)", "Minutes",
  "Setting", "Setting minutes", "Coverage", "Gradient depths", "Bled", "Rinse note", "Observations", "Notes", "Trial id",
];

/**
 * One cell. Text that a spreadsheet would run as a formula (starting with =, +, -, @, a tab or a
 * carriage return) gets a leading apostrophe (the OWASP "CSV injection" advice); numbers are written
 * as numbers. Cells with a quote, comma or line break are quoted, quotes doubled.
 */
export function csvCell(v: string | number | boolean | null | undefined): string {
  if (v === null || v === undefined) return "";
  let s: string;
  if (typeof v === "number") s = Number.isFinite(v) ? String(Math.round(v * 10_000) / 10_000) : "";
  else if (typeof v === "boolean") s = v ? "yes" : "no";
  else s = /^[=+\-@\t\r]/.test(v) ? `'${v}` : v;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function csvRow(cells: (string | number | boolean | null | undefined)[]): string {
  return cells.map(csvCell).join(",");
}

const round = (n: number, places: number) => Math.round(n * 10 ** places) / 10 ** places;

function dyesText(l: LayerDto): string {
  return l.dyes
    .map((d) => {
      const stock = d.stockMl !== null && d.stockPct !== null ? `; ${round(d.stockMl, 1)} ml of ${d.stockPct} % stock` : "";
      return `${d.dyeName} ${round(d.dosPct, 3)} % (${round(d.grams, 3)} g${stock})`;
    })
    .join("; ");
}

function acidText(l: LayerDto): string {
  if (l.acid.kind === "none") return "none";
  const unit = l.acid.kind === "vinegar" ? "ml vinegar" : "g citric acid";
  const amount = l.acid.amount !== null ? `${round(l.acid.amount, 1)} ${unit}` : l.acid.kind;
  return l.acid.ph !== null ? `${amount}, pH ${l.acid.ph}` : amount;
}

/** The CSV text for every trial matching the query (up to 5000 trials). */
export async function trialsCsv(em: EntityManager, studio: Studio, q: TrialQuery): Promise<string> {
  const { ids } = await matchingIds(em, studio, q);
  const { trials, layers } = await loadInOrder(em, ids);
  const lib = await loadLibrary(em, studio, [...layers.values()].flat().flatMap((l) => l.dyes));
  const lines = [csvRow(CSV_HEADER)];
  for (const t of trials) {
    const base = t.base?.isInitialized() ? t.base.getEntity().name : "";
    const head = [
      t.title, STATUS_LABELS[t.status as TrialStatus], t.createdAt.toISOString().slice(0, 10), t.updatedAt.toISOString().slice(0, 10),
      t.author.getEntity().name, base, t.fibreWeightG, t.tags.join("; "),
    ];
    const ls = (layers.get(t.id) ?? []).map((l) => layerDto(l, t.fibreWeightG, lib));
    if (ls.length === 0) lines.push(csvRow([...head, ...Array(15).fill(null), t.notesText, t.id]));
    for (const l of ls) {
      lines.push(
        csvRow([
          ...head, l.position + 1, METHOD_LABELS[l.method], dyesText(l), acidText(l), l.waterL,
          l.liquorRatio !== null ? round(l.liquorRatio, 1) : null, l.temperatureC, l.minutes,
          l.setting.method, l.setting.minutes, l.coverage, l.gradient?.depths.join(" / ") ?? null, l.bled,
          l.rinseNote, l.observations, t.notesText, t.id,
        ]),
      );
    }
  }
  return `\uFEFF${lines.join("\r\n")}\r\n`;
}
