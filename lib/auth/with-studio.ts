import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import { type Membership, type Role, type Studio, MembershipSchema, StudioSchema } from "@/entities/studio";
import { getEm } from "@/lib/db";
import { forbidden, notFound, toErrorResponse, unauthorized } from "@/lib/errors";
import { can, type Permission } from "./permissions";
import { getSessionUser, type SessionUser } from "./session";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export interface UserContext<P> {
  req: Request;
  em: EntityManager;
  user: SessionUser;
  params: P;
}

export interface StudioContext<P> extends UserContext<P> {
  studio: Studio;
  membership: Membership;
  role: Role;
}

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
  return withUser<P>(async (ctx) => {
    const { studioId } = ctx.params;
    if (!UUID.test(studioId)) throw notFound("This studio");
    const membership = await ctx.em.findOne(
      MembershipSchema,
      { studio: studioId, user: ctx.user.id },
      { populate: ["studio"] },
    );
    if (!membership) throw notFound("This studio");
    if (!can(membership.role, opts.can)) throw forbidden();
    return handler({ ...ctx, studio: membership.studio.getEntity(), membership, role: membership.role });
  });
}

/** Reads a JSON body; an empty or malformed body becomes a clear 400. */
export async function readJson(req: Request): Promise<unknown> {
  const text = await req.text();
  if (!text.trim()) return {};
  return JSON.parse(text);
}

export function isUuid(s: string): boolean {
  return UUID.test(s);
}
