import { OptimisticLockError, UniqueConstraintViolationException, ValidationError } from "@mikro-orm/core";
import { ZodError } from "zod";

// Errors a person can act on, each mapped to one HTTP status by toErrorResponse.
export class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
  }
}

export const unauthorized = (m = "Sign in to continue.") => new HttpError(401, m);
export const forbidden = (m = "Your role in this studio does not allow this.") => new HttpError(403, m);
export const notFound = (what = "This item") => new HttpError(404, `${what} was not found in this studio.`);
export const conflict = (m: string) => new HttpError(409, m);
export const badRequest = (m: string, fields?: Record<string, string>) => new HttpError(422, m, fields);
export const unavailable = (m: string) => new HttpError(503, m);

export const DATABASE_UNAVAILABLE = "The notebook's database is not reachable right now. Nothing was saved; try again in a moment.";
export const STORE_UNAVAILABLE = "The photo store is not reachable right now. Nothing was kept; try again in a moment.";

// Signs that the database could not be reached or dropped the connection: socket errors, a
// server shutting down or starting (57P01–57P03), connection exceptions (class 08), a pool that
// could not hand out a connection. Looked for on the error and on what it wraps.
const NET_CODES = new Set(["ECONNREFUSED", "ECONNRESET", "ETIMEDOUT", "EPIPE", "ENOTFOUND", "EHOSTUNREACH", "EAI_AGAIN"]);
const PG_CODES = /^(57P0[1-3]|08...)$/;
const PG_MESSAGES = /Connection terminated|Transaction query already complete|connection ended unexpectedly|Timeout acquiring a connection|terminating connection|the database system is (starting up|shutting down)|Client has encountered a connection error/i;

function causes(e: unknown): unknown[] {
  const out: unknown[] = [];
  for (let c: unknown = e; c && typeof c === "object" && out.length < 5; ) {
    out.push(c);
    const o = c as { cause?: unknown; previous?: unknown };
    c = o.cause ?? o.previous;
  }
  return out;
}

/** True when `e` says the database is unreachable (not that a query was wrong). */
export function isDatabaseUnavailable(e: unknown): boolean {
  return causes(e).some((c) => {
    const { code, message } = c as { code?: unknown; message?: unknown };
    if (typeof code === "string" && (NET_CODES.has(code) || PG_CODES.test(code))) return true;
    return typeof message === "string" && PG_MESSAGES.test(message);
  });
}

/** Field path → first message, for forms. */
export function zodFields(e: ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of e.issues) {
    const key = issue.path.join(".") || "_";
    out[key] ??= issue.message;
  }
  return out;
}

/** Turns any thrown value into a JSON response; never leaks a stack. */
export function toErrorResponse(e: unknown): Response {
  if (e instanceof HttpError) {
    const headers = e.status === 503 ? { "retry-after": "5" } : undefined;
    return Response.json({ error: e.message, ...(e.fields ? { fields: e.fields } : {}) }, { status: e.status, headers });
  }
  if (e instanceof ZodError) {
    const fields = zodFields(e);
    const first = Object.entries(fields)[0];
    const message = first ? `Check ${first[0] === "_" ? "the form" : `“${first[0]}”`}: ${first[1]}` : "Check the form.";
    return Response.json({ error: message, fields }, { status: 422 });
  }
  if (e instanceof OptimisticLockError) {
    return Response.json(
      { error: "Someone else saved this while you were editing. Reload to see their changes, then apply yours again." },
      { status: 409 },
    );
  }
  if (e instanceof UniqueConstraintViolationException) {
    return Response.json({ error: "That already exists in this studio." }, { status: 409 });
  }
  if (e instanceof SyntaxError) {
    return Response.json({ error: "The request body is not valid JSON." }, { status: 400 });
  }
  if (e instanceof ValidationError) {
    return Response.json({ error: e.message }, { status: 422 });
  }
  if (isDatabaseUnavailable(e)) {
    console.error("database unavailable:", e instanceof Error ? e.message : e);
    return Response.json({ error: DATABASE_UNAVAILABLE }, { status: 503, headers: { "retry-after": "5" } });
  }
  console.error(e);
  return Response.json({ error: "Something went wrong on our side. Try again in a moment." }, { status: 500 });
}
