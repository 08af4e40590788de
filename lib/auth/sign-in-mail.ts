// The wording of the e-mail that carries a one-time sign-in link.
export function signInMail(url: string): { subject: string; text: string; html: string } {
  const host = new URL(url).host;
  const text = `Open this link to sign in to Undertone on ${host}:\n\n${url}\n\nThe link works once, for 24 hours. If you did not ask for it, ignore this mail.`;
  const html = `<p>Open this link to sign in to Undertone on ${escapeHtml(host)}:</p>
<p><a href="${escapeHtml(url)}">Sign in to Undertone</a></p>
<p style="color:#6b6259">The link works once, for 24 hours. If you did not ask for it, ignore this mail.</p>`;
  return { subject: "Your Undertone sign-in link", text, html };
}

export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}
