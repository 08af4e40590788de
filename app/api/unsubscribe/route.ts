// GET /api/unsubscribe?token= – asks to confirm turning notification mail off; POST – turns it off (no sign-in: the token is signed)
import { escapeHtml } from "@/lib/auth/sign-in-mail";
import { readBodyText } from "@/lib/auth/with-studio";
import { getEm } from "@/lib/db";
import { unsubscribe, verifyUnsubscribeToken } from "@/lib/notifications";

// GET only asks: mail scanners open links, and opening a link should not change a setting.
function page(title: string, body: string, status = 200): Response {
  const html = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">
<title>${escapeHtml(title)} · Undertone</title>
<style>body{margin:0;background:#f6f2ea;color:#24201c;font:17px/1.5 system-ui,sans-serif}main{max-width:32rem;margin:12vh auto;padding:1.5rem;background:#fffdf8;border:1px solid #ddd4c6;border-radius:.5rem}h1{font:600 1.5rem Georgia,serif;margin:0 0 .5rem}button,a.b{display:inline-flex;align-items:center;min-height:44px;padding:0 1rem;border-radius:.375rem;border:1px solid #2e4a62;background:#2e4a62;color:#fff;font:inherit;text-decoration:none;cursor:pointer}p{color:#5e564d}</style>
</head><body><main><h1>${escapeHtml(title)}</h1>${body}</main></body></html>`;
  return new Response(html, { status, headers: { "content-type": "text/html; charset=utf-8", "cache-control": "no-store" } });
}

const invalid = () =>
  page("This link does not work", "<p>The unsubscribe link is incomplete or was changed. You can turn mail off in your account settings after signing in.</p>", 400);

export async function GET(req: Request): Promise<Response> {
  const token = new URL(req.url).searchParams.get("token") ?? "";
  if (!verifyUnsubscribeToken(token)) return invalid();
  return page(
    "Stop notification mail?",
    `<p>You will no longer get e-mail about comments, mentions and trials you follow. Notifications still appear in Undertone.</p>
<form method="post" action="/api/unsubscribe"><input type="hidden" name="token" value="${escapeHtml(token)}"><button type="submit">Stop mail</button></form>`,
  );
}

export async function POST(req: Request): Promise<Response> {
  const url = new URL(req.url);
  let token = url.searchParams.get("token") ?? "";
  if (!token && (req.headers.get("content-type") ?? "").includes("application/x-www-form-urlencoded")) {
    // A token is under 200 characters; a form far larger than that is not one of ours.
    const form = await readBodyText(req, 10_000).catch(() => "");
    token = String(new URLSearchParams(form).get("token") ?? "");
  }
  try {
    const result = await unsubscribe(await getEm(), token);
    if (!result.ok) return invalid();
    return page(
      "Mail is off",
      `<p>Undertone will not send notification mail to ${escapeHtml(result.email ?? "you")} any more. You can turn it back on in your account.</p><p><a class="b" href="/account">Account settings</a></p>`,
    );
  } catch (e) {
    console.error(e);
    return page("Something went wrong", "<p>Try the link again in a moment.</p>", 500);
  }
}
