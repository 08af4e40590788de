import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import { type Role, type Studio, StudioSchema } from "@/entities/studio";
import { UserSchema } from "@/entities/user";
import { getEm } from "@/lib/db";
import { forbidden, HttpError, notFound, toErrorResponse, unauthorized } from "@/lib/errors";
import { can, type Permission } from "./permissions";
import { getSessionUser, getSessionUserId, type SessionUser } from "./session";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export interface UserContext<P> {
  req: Request;
  em: EntityManager;
  user: SessionUser;
  params: P;
}

export interface StudioContext<P> extends UserContext<P> {
  studio: Studio;
  role: Role;
}

/** The caller's membership of a studio, with the studio and the user, in one row. */
interface MembershipRow {
  role: Role;
  studio_id: string;
  studio_name: string;
  lot_tolerance: number;
  lots_for_repeatable: number;
  stock_shelf_life_days: number;
  studio_created_at: Date;
  user_email: string;
  user_name: string;
}

// Every studio route asks this first, so it is one hand-written query (the ORM's findOne with two
// joined relations cost ~3 ms of CPU per request, this ~0.4 ms; npm run load shows the difference).
const MEMBERSHIP_SQL = `select m.role, s.id as studio_id, s.name as studio_name, s.lot_tolerance, s.lots_for_repeatable,
       s.stock_shelf_life_days, s.created_at as studio_created_at, u.email as user_email, u.name as user_name
  from memberships m join studios s on s.id = m.studio_id join users u on u.id = m.user_id
 where m.studio_id = ? and m.user_id = ?`;

type RouteArgs<P> = { params: Promise<P> };

/** Wraps a route handler that needs a signed-in user but no studio. */
export function withUser<P = Record<string, never>>(handler: (ctx: UserContext<P>) => Promise<Response>) {
  return async (req: Request, args: RouteArgs<P>): Promise<Response> => {
    try {
      const user = await getSessionUser();
      if (!user) throw unauthorized();
      const em = await getEm();
      return await handler({ req, em, user, params: await args.params });
    } catch (e) {
      return toErrorResponse(e);
    }
  };
}

/**
 * Wraps a studio route handler: session → membership of the studio in the URL → permission.
 * A studio the caller does not belong to answers 404, so its existence is not revealed.
 */
export function withStudio<P extends { studioId: string }>(
  handler: (ctx: StudioContext<P>) => Promise<Response>,
  opts: { can: Permission },
) {
  return async (req: Request, args: RouteArgs<P>): Promise<Response> => {
    try {
      const userId = await getSessionUserId();
      if (!userId) throw unauthorized();
      const params = await args.params;
      const em = await getEm();
      // The user, the membership and the studio in one query: every studio route pays for it.
      const [row] = UUID.test(params.studioId)
        ? await em.getConnection().execute<MembershipRow[]>(MEMBERSHIP_SQL, [params.studioId, userId])
        : [];
      if (!row) {
        // As withUser: a deleted account is signed out (401), not merely outside the studio.
        if (!(await em.findOne(UserSchema, { id: userId }))) throw unauthorized();
        throw notFound("This studio");
      }
      if (!can(row.role, opts.can)) throw forbidden();
      const user: SessionUser = { id: userId, email: row.user_email, name: row.user_name };
      // A managed entity, as if the ORM had loaded it: handlers read it, point new rows at it, update it.
      const studio = em.map(StudioSchema, {
        id: row.studio_id,
        name: row.studio_name,
        lot_tolerance: row.lot_tolerance,
        lots_for_repeatable: row.lots_for_repeatable,
        stock_shelf_life_days: row.stock_shelf_life_days,
        created_at: row.studio_created_at,
      });
      return await handler({ req, em, user, params, studio, role: row.role });
    } catch (e) {
      return toErrorResponse(e);
    }
  };
}

/**
 * Larger than any body the app takes: the longest are notes and comments, whose documents are
 * capped at about 100 000 characters of JSON (under 400 kB even written in emoji). Photos go to
 * the object store directly, never through here.
 */
export const MAX_BODY_BYTES = 1_000_000;
const tooLarge = (max: number) =>
  new HttpError(413, `The request is too large (over ${max >= 1_000_000 ? `${max / 1_000_000} MB` : `${max / 1000} kB`}). Shorten the text and try again.`);

/** The body as text, refused (413) once it passes `max` bytes: a declared length is believed, a stream is counted. */
export async function readBodyText(req: Request, max = MAX_BODY_BYTES): Promise<string> {
  if (Number(req.headers.get("content-length")) > max) throw tooLarge(max);
  if (!req.body) return "";
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let bytes = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    bytes += value.byteLength;
    if (bytes > max) {
      // Not awaited: cancelling one branch of a cloned body settles only when the other is cancelled too.
      void reader.cancel().catch(() => undefined);
      throw tooLarge(max);
    }
    chunks.push(value);
  }
  return new TextDecoder().decode(Buffer.concat(chunks));
}

/** Deeper than any body the app takes (an editor document is the deepest, about a dozen levels). */
const MAX_BODY_DEPTH = 64;

/** How deep arrays and objects nest in JSON text, counted without parsing it. */
function nesting(text: string): number {
  let depth = 0;
  let max = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 92 /* \ */) i++;
      else if (c === 34 /* " */) inString = false;
    } else if (c === 34) inString = true;
    else if (c === 91 /* [ */ || c === 123 /* { */) max = Math.max(max, ++depth);
    else if (c === 93 /* ] */ || c === 125 /* } */) depth--;
  }
  return max;
}

/** Text PostgreSQL can store: no NUL character, no half of a surrogate pair (JSON can carry both). */
function storable(s: string): boolean {
  return !s.includes("\u0000") && s.isWellFormed();
}

/**
 * Reads a JSON body; an empty or malformed body becomes a clear 400. So does one nested past
 * MAX_BODY_DEPTH: parsing it is fine, but every later step that walks it recursively (zod, JSON
 * writing, the database driver) would run out of stack. Text the database cannot hold is a 422
 * here, before any handler could try to write it. A body over MAX_BODY_BYTES is a 413, unread.
 */
export async function readJson(req: Request): Promise<unknown> {
  const text = await readBodyText(req);
  if (!text.trim()) return {};
  if (nesting(text) > MAX_BODY_DEPTH) throw new HttpError(400, "The request body is nested too deeply.");
  return JSON.parse(text, (key, value) => {
    if (!storable(key) || (typeof value === "string" && !storable(value))) {
      throw new HttpError(422, "Some text holds a character that cannot be saved (a NUL, or half of an emoji). Remove it and try again.");
    }
    return value;
  });
}

export function isUuid(s: string): boolean {
  return UUID.test(s);
}
