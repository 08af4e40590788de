import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import type { DyeSchema, YarnBaseSchema } from "@/entities/library";
import type { Studio } from "@/entities/studio";
import { isUuid } from "@/lib/auth/with-studio";
import { badRequest, conflict, notFound } from "@/lib/errors";

// Pieces the three library modules share: lookups scoped by studio, version checks, sorting.

/** A `$ilike` pattern that matches `text` literally somewhere inside. */
export function containsPattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/** A `$ilike` pattern that matches `text` literally and whole (case-insensitive equality). */
export function exactPattern(text: string): string {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`);
}

/** Compares the version the client last saw with the stored one; stale → 409 with a plain message. */
export function checkVersion(entity: { version: number; archived: boolean }, version: number, what: string): void {
  if (entity.archived) throw conflict(`This ${what} has been archived and can no longer be edited.`);
  if (entity.version !== version) {
    throw conflict(`Someone else saved this ${what} while you were editing. Reload to see their changes, then apply yours again.`);
  }
}

type Key = string | number | null | undefined;

/** Sorts a copy by one key: text by the reader's alphabet, numbers numerically, blanks last. */
export function sortRows<T>(rows: T[], key: (row: T) => Key, dir: "asc" | "desc" = "asc", tie?: (row: T) => string): T[] {
  const sign = dir === "desc" ? -1 : 1;
  return [...rows].sort((a, b) => {
    const ka = key(a);
    const kb = key(b);
    if (ka == null || kb == null) {
      if (ka == null && kb == null) return tie ? tie(a).localeCompare(tie(b)) : 0;
      return ka == null ? 1 : -1;
    }
    const c = typeof ka === "number" && typeof kb === "number" ? ka - kb : String(ka).localeCompare(String(kb), "en", { sensitivity: "base" });
    if (c !== 0) return sign * c;
    return tie ? tie(a).localeCompare(tie(b)) : 0;
  });
}

/** Rejects a second active item with the same name (any letter case) in one studio. */
export async function assertNameFree(
  em: EntityManager,
  schema: typeof YarnBaseSchema | typeof DyeSchema,
  studio: Studio,
  name: string,
  what: string,
  exceptId?: string,
): Promise<void> {
  // Both schemas have studio, name and archived; the cast only picks one of the two types.
  const same = await em.find(schema as typeof YarnBaseSchema, { studio, archived: false, name: { $ilike: exactPattern(name) } });
  if (same.some((s) => s.id !== exceptId)) {
    throw badRequest(`There is already a ${what} called “${name}”.`, { name: `There is already a ${what} called “${name}”; choose another name.` });
  }
}

/** An id from the URL that is not a UUID cannot be in this studio: the same 404 as a stranger's id. */
export function assertId(id: string, what: string): void {
  if (!isUuid(id)) throw notFound(what);
}

export { notFound };

/** A request's query string as a plain object, blank values dropped, for a zod list-query schema. */
export function searchParamsOf(req: Request): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, v] of new URL(req.url).searchParams) if (v.trim() !== "") out[k] = v;
  return out;
}
