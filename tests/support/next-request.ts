// Runs a route handler inside a Next request scope, for handlers that read next/headers themselves
// (next-auth's catch-all route does: cookies() and headers() throw outside a request). Next's own
// request and work stores are used, so cookies and headers come from the Request as in a server.
import { AsyncLocalStorage } from "node:async_hooks";

// Next's storages fall back to a throwing fake unless the server's global is set before they load.
(globalThis as { AsyncLocalStorage?: unknown }).AsyncLocalStorage ??= AsyncLocalStorage;

type AnyHandler = (req: Request, ctx: { params: Promise<unknown> }) => Promise<Response>;

/** Calls `handler` with a NextRequest for `url` as Next's router would, within a request scope. */
export async function callInRequestScope(
  handler: AnyHandler,
  page: string,
  url: string,
  init: RequestInit,
  params: unknown,
): Promise<Response> {
  const { NextRequest } = await import("next/server");
  const { workAsyncStorage } = await import("next/dist/server/app-render/work-async-storage.external");
  const { workUnitAsyncStorage } = await import("next/dist/server/app-render/work-unit-async-storage.external");
  const { createWorkStore } = await import("next/dist/server/async-storage/work-store");
  const { createRequestStoreForAPI } = await import("next/dist/server/async-storage/request-store");
  const req = new NextRequest(url, init as ConstructorParameters<typeof NextRequest>[1]);
  const u = new URL(url);
  const work = createWorkStore({
    page,
    renderOpts: { experimental: {} },
    isPrefetchRequest: false,
    buildId: "test",
    previouslyRevalidatedTags: [],
  } as never);
  const unit = createRequestStoreForAPI(
    req as never,
    { pathname: u.pathname, search: u.search } as never,
    { tags: [], expirationsByCacheKind: new Map() } as never,
    undefined,
    undefined as never,
    undefined,
  );
  return workAsyncStorage.run(work, () => workUnitAsyncStorage.run(unit, () => handler(req, { params: Promise.resolve(params) })));
}
