// Calls App Router route handlers directly, the way Next does: a Request and a params promise.
type Handler<P> = (req: Request, args: { params: Promise<P> }) => Promise<Response>;

export interface CallOptions {
  /** Sent as JSON unless `raw` is given. */
  body?: unknown;
  /** Sent as-is (e.g. malformed JSON). */
  raw?: string;
}

export interface CallResult {
  status: number;
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  json: any;
}

/** Runs a handler and reads its JSON body (null for an empty body). */
export async function call<P>(
  handler: Handler<P>,
  method: string,
  params: P,
  opts: CallOptions = {},
): Promise<CallResult> {
  const hasBody = opts.raw !== undefined || opts.body !== undefined;
  const req = new Request("http://127.0.0.1/api/test", {
    method,
    headers: hasBody ? { "content-type": "application/json" } : undefined,
    body: opts.raw ?? (opts.body !== undefined ? JSON.stringify(opts.body) : undefined),
  });
  const res = await handler(req, { params: Promise.resolve(params) });
  const text = await res.text();
  return { status: res.status, json: text ? JSON.parse(text) : null };
}
