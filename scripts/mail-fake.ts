// Local mail fake: an SMTP server on 127.0.0.1 (no auth, no STARTTLS) that saves each
// message as .eml under .data/mail, and a small HTTP API for tests and developers:
//   GET /messages[?to=addr]  list (oldest first)   GET /messages/:id  one message
//   DELETE /messages         remove all            DELETE /messages/:id  remove one
// Started detached by scripts/services.sh; stops on SIGTERM.
import { SMTPServer } from "smtp-server";
import { simpleParser, type AddressObject } from "mailparser";
import { createServer, type ServerResponse } from "node:http";
import { mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

const root = fileURLToPath(new URL("..", import.meta.url));
const dataDir = process.env.UNDERTONE_DATA_DIR ?? path.join(root, ".data");
const dir = path.join(dataDir, "mail");
const smtpPort = Number(process.env.SMTP_PORT ?? 2525);
const httpPort = Number(process.env.MAIL_HTTP_PORT ?? 2580);
const ENVELOPE = "x-undertone-envelope-to";

let counter = 0;
const newId = () => `${Date.now()}-${String(++counter).padStart(6, "0")}`;
const idOk = (id: string) => /^[0-9]+-[0-9]+$/.test(id);

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
  const list = field === undefined ? [] : Array.isArray(field) ? field : [field];
  return list.flatMap((a) => a.value.map((v) => (v.address ?? "").toLowerCase())).filter(Boolean);
}

async function load(id: string) {
  const raw = readFileSync(path.join(dir, `${id}.eml`));
  const mail = await simpleParser(raw);
  const envelope = String(mail.headers.get(ENVELOPE) ?? "")
    .split(",")
    .map((s) => s.trim().toLowerCase())
    .filter(Boolean);
  const to = [...new Set([...addresses(mail.to), ...addresses(mail.cc), ...envelope])];
  return {
    id,
    to,
    from: addresses(mail.from)[0] ?? "",
    subject: mail.subject ?? "",
    text: mail.text ?? "",
    html: mail.html || null,
    date: (mail.date ?? new Date(Number(id.split("-")[0]))).toISOString(),
  };
}

const ids = () =>
  readdirSync(dir)
    .filter((f) => f.endsWith(".eml"))
    .map((f) => f.slice(0, -4))
    .sort();

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ["AUTH", "STARTTLS"],
  logger: false,
  onData(stream, session, callback) {
    const chunks: Buffer[] = [];
    stream.on("data", (c: Buffer) => chunks.push(c));
    stream.on("end", () => {
      const rcpt = session.envelope.rcptTo.map((r) => r.address).join(", ");
      const head = Buffer.from(`X-Undertone-Envelope-To: ${rcpt}\r\n`);
      const id = newId();
      try {
        writeFileSync(path.join(dir, `${id}.eml`), Buffer.concat([head, ...chunks]));
        console.log(`mail ${id} to ${rcpt}`);
        callback();
      } catch (e) {
        callback(e as Error);
      }
    });
  },
});

function send(res: ServerResponse, status: number, body: unknown) {
  res.writeHead(status, { "content-type": "application/json" });
  res.end(JSON.stringify(body));
}

const http = createServer(async (req, res) => {
  try {
    const url = new URL(req.url ?? "/", `http://127.0.0.1:${httpPort}`);
    const [, first, id] = url.pathname.split("/");
    if (first !== "messages") return send(res, 404, { error: "not found" });
    if (id !== undefined && !idOk(id)) return send(res, 404, { error: "no such message" });
    if (req.method === "GET" && id === undefined) {
      const to = url.searchParams.get("to")?.toLowerCase();
      const all = await Promise.all(ids().map(load));
      return send(res, 200, to ? all.filter((m) => m.to.includes(to)) : all);
    }
    if (req.method === "GET") {
      if (!ids().includes(id)) return send(res, 404, { error: "no such message" });
      return send(res, 200, await load(id));
    }
    if (req.method === "DELETE") {
      const gone = id === undefined ? ids() : ids().filter((m) => m === id);
      for (const m of gone) rmSync(path.join(dir, `${m}.eml`), { force: true });
      return send(res, 200, { deleted: gone.length });
    }
    send(res, 405, { error: "method not allowed" });
  } catch (e) {
    send(res, 500, { error: String(e) });
  }
});

mkdirSync(dir, { recursive: true });
smtp.on("error", (e) => console.error("smtp error", e));
smtp.listen(smtpPort, "127.0.0.1", () => {
  http.listen(httpPort, "127.0.0.1", () => {
    console.log(`mail fake: smtp 127.0.0.1:${smtpPort}, http 127.0.0.1:${httpPort}, data ${dir}`);
  });
});
// A port already taken ends the process, so services.sh sees the failure.
http.on("error", (e) => {
  console.error(e);
  process.exit(1);
});

const stop = () => smtp.close(() => http.close(() => process.exit(0)));
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
