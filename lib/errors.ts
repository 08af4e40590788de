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
    return Response.json({ error: e.message, ...(e.fields ? { fields: e.fields } : {}) }, { status: e.status });
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
  console.error(e);
  return Response.json({ error: "Something went wrong on our side. Try again in a moment." }, { status: 500 });
}
