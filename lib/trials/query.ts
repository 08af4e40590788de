import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import { DyeSchema, YarnBaseSchema } from "@/entities/library";
import type { Studio } from "@/entities/studio";
import { LayerSchema, type Layer, type Trial, TrialSchema } from "@/entities/trial";
import type { TrialQuery } from "@/lib/schemas/trial";
import type { TrialFacets, TrialPage, TrialSummaryDto } from "./types";

// The trial list: search over title, notes, dye names and base name; filters; sort; pages — all in
// SQL, always inside one studio.

/** Escapes LIKE wildcards so a search for "50%" means the text "50%". */
function likePattern(word: string): string {
  return `%${word.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/** The WHERE clause and its parameters for a query's search and filters. */
export function whereFor(studio: Studio, q: TrialQuery): { sql: string; params: unknown[] } {
  const parts = ["t.studio_id = ?"];
  const params: unknown[] = [studio.id];
  const words = (q.q ?? "").split(/\s+/).filter(Boolean).slice(0, 8);
  for (const w of words) {
    const p = likePattern(w);
    parts.push(`(t.title ilike ? or t.notes_text ilike ? or b.name ilike ? or exists (
      select 1 from layers l cross join lateral jsonb_array_elements(l.dyes) ld
      join dyes dy on dy.id::text = ld->>'dyeId' and dy.studio_id = t.studio_id
      where l.trial_id = t.id and dy.name ilike ?))`);
    params.push(p, p, p, p);
  }
  if (q.baseId) {
    parts.push("t.base_id = ?");
    params.push(q.baseId);
  }
  if (q.dyeId) {
    parts.push("exists (select 1 from layers l where l.trial_id = t.id and l.dyes @> ?::jsonb)");
    params.push(JSON.stringify([{ dyeId: q.dyeId }]));
  }
  if (q.method) {
    parts.push("exists (select 1 from layers l where l.trial_id = t.id and l.method = ?)");
    params.push(q.method);
  }
  if (q.tag) {
    parts.push("t.tags @> ?::jsonb");
    params.push(JSON.stringify([q.tag.toLowerCase()]));
  }
  if (q.authorId) {
    parts.push("t.author_id = ?");
    params.push(q.authorId);
  }
  if (q.status) {
    parts.push("t.status = ?");
    params.push(q.status);
  }
  // Dates are calendar days in UTC, both ends included, on the day the trial was started.
  if (q.from) {
    parts.push("t.created_at >= (?::date)::timestamp at time zone 'UTC'");
    params.push(q.from);
  }
  if (q.to) {
    parts.push("t.created_at < (?::date + 1)::timestamp at time zone 'UTC'");
    params.push(q.to);
  }
  return { sql: parts.join(" and "), params };
}

const SORTS = { updated: "t.updated_at", created: "t.created_at", title: "lower(t.title)" } as const;

/** The sort key and direction of a query; the id breaks ties in the same direction. */
function orderFor(q: TrialQuery): { key: string; dir: "asc" | "desc" } {
  const dir = (q.dir ?? (q.sort === "title" ? "asc" : "desc")) === "asc" ? "asc" : "desc";
  return { key: SORTS[q.sort], dir };
}

/** The ids of matching trials in order (all of them when `page` is absent) and the total. */
export async function matchingIds(
  em: EntityManager,
  studio: Studio,
  q: TrialQuery,
  page?: { page: number; pageSize: number },
): Promise<{ ids: string[]; total: number }> {
  const { sql, params } = whereFor(studio, q);
  const from = `from trials t left join yarn_bases b on b.id = t.base_id where ${sql}`;
  const { key, dir } = orderFor(q);
  const order = `order by ${key} ${dir}, t.id ${dir}`;
  const limit = page ? ` limit ${page.pageSize} offset ${(page.page - 1) * page.pageSize}` : " limit 5000";
  const conn = em.getConnection();
  const [rows, count] = await Promise.all([
    conn.execute<{ id: string }[]>(`select t.id ${from} ${order}${limit}`, params),
    conn.execute<{ n: string }[]>(`select count(*) as n ${from}`, params),
  ]);
  return { ids: rows.map((r) => r.id), total: Number(count[0]?.n ?? 0) };
}

/** Loads trials by id, keeping the given order, with their authors, bases and layers. */
export async function loadInOrder(em: EntityManager, ids: string[]): Promise<{ trials: Trial[]; layers: Map<string, Layer[]> }> {
  if (ids.length === 0) return { trials: [], layers: new Map() };
  const [found, layers] = await Promise.all([
    em.find(TrialSchema, { id: { $in: ids } }, { populate: ["author", "base"] }),
    em.find(LayerSchema, { trial: { $in: ids } }, { orderBy: { position: "asc" } }),
  ]);
  const byId = new Map<string, Trial>(found.map((t) => [t.id, t as Trial]));
  const byTrial = new Map<string, Layer[]>();
  for (const l of layers) byTrial.set(l.trial.id, [...(byTrial.get(l.trial.id) ?? []), l]);
  return { trials: ids.map((id) => byId.get(id)).filter((t): t is Trial => !!t), layers: byTrial };
}

interface SummaryRow {
  id: string;
  title: string;
  status: TrialSummaryDto["status"];
  tags: string[];
  fibre_weight_g: number;
  created_at: Date;
  updated_at: Date;
  version: number;
  author_id: string;
  author_name: string;
  base_id: string | null;
  base_name: string | null;
  methods: TrialSummaryDto["methods"];
  dyes: TrialSummaryDto["dyes"];
}

/**
 * One page of the list in a single query (the total in a second, alongside): the page's ids are
 * read in order through the sort's index, then each row gets its author and base names, its
 * layers' methods in layer order and each dye once, in order of first use, named from the
 * studio's library. Nothing is loaded as entities: the list only shows these fields.
 */
export async function listTrials(em: EntityManager, studio: Studio, q: TrialQuery): Promise<TrialPage> {
  const { sql, params } = whereFor(studio, q);
  const { key, dir } = orderFor(q);
  const from = `from trials t left join yarn_bases b on b.id = t.base_id where ${sql}`;
  const pageSql = `
    select t.id, t.title, t.status, t.tags, t.fibre_weight_g, t.created_at, t.updated_at, t.version,
           t.author_id, u.name as author_name, t.base_id, b.name as base_name,
           coalesce(ls.methods, '[]'::jsonb) as methods, coalesce(ds.dyes, '[]'::jsonb) as dyes
    from (select t.id, ${key} as k ${from} order by k ${dir}, t.id ${dir}
          limit ${q.pageSize} offset ${(q.page - 1) * q.pageSize}) p
    join trials t on t.id = p.id
    join users u on u.id = t.author_id
    left join yarn_bases b on b.id = t.base_id
    left join lateral (select jsonb_agg(l.method order by l.position) as methods from layers l where l.trial_id = t.id) ls on true
    left join lateral (
      select jsonb_agg(jsonb_build_object('dyeId', e.dye_id, 'name', coalesce(dy.name, 'Removed dye'), 'displayHex', dy.display_hex)
                       order by e.position, e.ord) as dyes
      from (select distinct on (x.value->>'dyeId') x.value->>'dyeId' as dye_id, l.position, x.ord
            from layers l cross join lateral jsonb_array_elements(l.dyes) with ordinality as x(value, ord)
            where l.trial_id = t.id
            order by x.value->>'dyeId', l.position, x.ord) e
      left join dyes dy on dy.id::text = e.dye_id and dy.studio_id = t.studio_id
    ) ds on true
    order by p.k ${dir}, p.id ${dir}`;
  const conn = em.getConnection();
  const [rows, count] = await Promise.all([
    conn.execute<SummaryRow[]>(pageSql, params),
    conn.execute<{ n: string }[]>(`select count(*) as n ${from}`, params),
  ]);
  const items = rows.map(
    (r): TrialSummaryDto => ({
      id: r.id,
      title: r.title,
      status: r.status,
      tags: r.tags,
      fibreWeightG: r.fibre_weight_g,
      createdAt: new Date(r.created_at).toISOString(),
      updatedAt: new Date(r.updated_at).toISOString(),
      version: r.version,
      author: { id: r.author_id, name: r.author_name },
      base: r.base_id ? { id: r.base_id, name: r.base_name ?? "" } : null,
      layerCount: r.methods.length,
      methods: [...new Set(r.methods)],
      dyes: r.dyes,
    }),
  );
  return { items, total: Number(count[0]?.n ?? 0), page: q.page, pageSize: q.pageSize };
}

/** What the filters offer: the studio's bases and dyes, and the tags and authors its trials use. */
export async function trialFacets(em: EntityManager, studio: Studio): Promise<TrialFacets> {
  const conn = em.getConnection();
  const [bases, dyes, tags, authors] = await Promise.all([
    em.find(YarnBaseSchema, { studio }, { orderBy: { name: "asc" }, fields: ["id", "name"] }),
    em.find(DyeSchema, { studio }, { orderBy: { name: "asc" }, fields: ["id", "name", "displayHex"] }),
    conn.execute<{ tag: string }[]>(
      "select distinct jsonb_array_elements_text(tags) as tag from trials where studio_id = ? order by tag",
      [studio.id],
    ),
    conn.execute<{ id: string; name: string }[]>(
      "select distinct u.id, u.name from trials t join users u on u.id = t.author_id where t.studio_id = ? order by u.name",
      [studio.id],
    ),
  ]);
  return {
    bases: bases.map((b) => ({ id: b.id, name: b.name })),
    dyes: dyes.map((d) => ({ id: d.id, name: d.name, displayHex: d.displayHex ?? null })),
    tags: tags.map((t) => t.tag),
    authors: authors.map((a) => ({ id: a.id, name: a.name })),
  };
}
