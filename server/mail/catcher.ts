/**
 * The local mail catcher: an SMTP server on 127.0.0.1 that accepts every message, parses it and keeps it
 * (newest first) so it can be read at /dev/mail instead of being delivered. With `dir` the messages are
 * also written to disk (one folder per message: message.json and the attachments' bytes), so a restart
 * keeps the inbox. Used whenever no SMTP_URL is set; it never relays anything anywhere.
 */
import { EventEmitter } from "node:events";
import { randomBytes } from "node:crypto";
import { mkdir, readdir, readFile, rename, rm, writeFile } from "node:fs/promises";
import path from "node:path";
import { SMTPServer } from "smtp-server";
import { simpleParser, type AddressObject, type ParsedMail } from "mailparser";
import { CAUGHT_ID_PATTERN as ID_PATTERN, type CaughtAttachmentInfo, type CaughtMessage } from "./caught-message";

export { isCaughtMessageId, type CaughtAttachmentInfo, type CaughtMessage } from "./caught-message";

export interface CaughtAttachment extends CaughtAttachmentInfo {
  content: Buffer;
}

export interface MailCatcherOptions {
  /** 0 picks a free port. */
  port?: number;
  host?: string;
  /** Oldest messages beyond this are dropped (memory and disk). Default 500. */
  maxMessages?: number;
  /** Folder to keep messages in across restarts (e.g. .data/mail). Memory only when omitted. */
  dir?: string;
  /** Largest message accepted, in bytes. Default 30 MB. */
  maxMessageBytes?: number;
}

export interface MailCatcher {
  /** The port it listens on (0 until listen() resolves). */
  readonly port: number;
  readonly host: string;
  listen(): Promise<number>;
  messages(): CaughtMessage[];
  get(id: string): CaughtMessage | undefined;
  attachment(id: string, index: number): Promise<CaughtAttachment | undefined>;
  /** Resolves with the first message (already caught or arriving) that matches; rejects after timeoutMs. */
  waitFor(match: (m: CaughtMessage) => boolean, timeoutMs?: number): Promise<CaughtMessage>;
  clear(): Promise<void>;
  close(): Promise<void>;
}


const newId = () => `${String(Date.now()).padStart(13, "0")}-${randomBytes(4).toString("hex")}`;

function addresses(value: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(value) ? value : value ? [value] : [];
  const out: string[] = [];
  const walk = (entries: AddressObject["value"]) => {
    for (const e of entries) {
      if (e.address) out.push(e.address);
      if (e.group) walk(e.group);
    }
  };
  for (const a of list) walk(a.value);
  return out;
}

function headerString(parsed: ParsedMail, name: string): string | null {
  const v = parsed.headers.get(name);
  return typeof v === "string" ? v : null;
}

const safeContentType = (t: string | undefined) =>
  t && /^[a-z0-9!#$&^_.+-]+\/[a-z0-9!#$&^_.+-]+$/i.test(t) ? t.toLowerCase() : "application/octet-stream";

/** Creates the catcher without listening (its inbox can be read at once); startMailCatcher also listens. */
export function createMailCatcher(options: MailCatcherOptions = {}): MailCatcher {
  const host = options.host ?? "127.0.0.1";
  const maxMessages = options.maxMessages ?? 500;
  const dir = options.dir ? path.resolve(options.dir) : undefined;
  const inbox: CaughtMessage[] = []; // newest first
  const contents = new Map<string, Buffer[]>(); // attachment bytes of messages caught by this process
  const events = new EventEmitter();
  events.setMaxListeners(0);
  let port = 0;
  let listening: Promise<number> | null = null;
  let writes = Promise.resolve(); // disk writes in arrival order

  const messageDir = (id: string) => path.join(dir!, id);

  async function persist(msg: CaughtMessage, files: Buffer[]) {
    if (!dir) return;
    const tmp = path.join(dir, `.tmp-${msg.id}`);
    await mkdir(tmp, { recursive: true });
    await Promise.all(files.map((buf, i) => writeFile(path.join(tmp, `attachment-${i}`), buf)));
    await writeFile(path.join(tmp, "message.json"), JSON.stringify(msg, null, 2));
    await rename(tmp, messageDir(msg.id)); // a folder with message.json is always complete
  }

  function trim(): string[] {
    const dropped = inbox.splice(maxMessages).map((m) => m.id);
    for (const id of dropped) contents.delete(id);
    return dropped;
  }

  async function loadFromDisk() {
    if (!dir) return;
    await mkdir(dir, { recursive: true });
    const names = await readdir(dir);
    const loaded: CaughtMessage[] = [];
    for (const name of names) {
      if (name.startsWith(".tmp-")) {
        await rm(path.join(dir, name), { recursive: true, force: true }); // half-written before a crash
        continue;
      }
      if (!ID_PATTERN.test(name)) continue;
      try {
        loaded.push(JSON.parse(await readFile(path.join(dir, name, "message.json"), "utf8")) as CaughtMessage);
      } catch {
        // unreadable leftovers are ignored, not fatal
      }
    }
    const known = new Set(inbox.map((m) => m.id));
    inbox.push(...loaded.filter((m) => !known.has(m.id)));
    inbox.sort((a, b) => (a.id < b.id ? 1 : a.id > b.id ? -1 : 0));
    for (const id of trim()) await rm(messageDir(id), { recursive: true, force: true });
  }

  async function receive(raw: NodeJS.ReadableStream, envelope: { from: string; to: string[] }) {
    const parsed = await simpleParser(raw as never);
    if ((raw as { sizeExceeded?: boolean }).sizeExceeded) {
      throw Object.assign(new Error("Message exceeds the catcher's size limit"), { responseCode: 552 });
    }
    const company = headerString(parsed, "x-ridgewright-company");
    const msg: CaughtMessage = {
      id: newId(),
      messageId: parsed.messageId ?? null,
      from: addresses(parsed.from)[0] ?? envelope.from,
      to: addresses(parsed.to),
      cc: addresses(parsed.cc),
      envelopeTo: envelope.to,
      subject: parsed.subject ?? "",
      text: parsed.text ?? "",
      html: typeof parsed.html === "string" ? parsed.html : null,
      date: new Date().toISOString(),
      attachments: parsed.attachments.map((a, i) => ({
        filename: a.filename ?? `attachment-${i + 1}`,
        contentType: safeContentType(a.contentType),
        size: a.content.length,
      })),
      companyId: company && /^\d+$/.test(company) ? Number(company) : null,
      kind: headerString(parsed, "x-ridgewright-kind"),
    };
    const files = parsed.attachments.map((a) => a.content);
    inbox.unshift(msg);
    contents.set(msg.id, files);
    const dropped = trim();
    const write = writes.then(async () => {
      await persist(msg, files);
      if (dir) for (const id of dropped) await rm(messageDir(id), { recursive: true, force: true });
    });
    writes = write.catch(() => {});
    await write;
    events.emit("message", msg);
  }

  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    allowInsecureAuth: true,
    onAuth(auth, _session, callback) {
      callback(null, { user: auth.username ?? "catcher" }); // a catcher accepts any credentials
    },
    banner: "Ridgewright local mail catcher (nothing is delivered)",
    size: options.maxMessageBytes ?? 30 * 1024 * 1024,
    closeTimeout: 2_000,
    logger: false,
    onData(stream, session, callback) {
      const envelope = {
        from: session.envelope.mailFrom ? session.envelope.mailFrom.address : "",
        to: session.envelope.rcptTo.map((r) => r.address),
      };
      receive(stream, envelope).then(
        () => callback(),
        (err: Error) => callback(err),
      );
    },
  });
  server.on("error", () => {}); // connection-level errors (a client hanging up) are not fatal

  return {
    get port() {
      return port;
    },
    host,
    listen() {
      listening ??= (async () => {
        await loadFromDisk();
        await new Promise<void>((resolve, reject) => {
          const onError = (err: Error) => reject(err);
          server.server.once("error", onError);
          server.listen(options.port ?? 0, host, () => {
            server.server.off("error", onError);
            resolve();
          });
        });
        const addr = server.server.address();
        port = typeof addr === "object" && addr ? addr.port : (options.port ?? 0);
        return port;
      })();
      return listening;
    },
    messages: () => inbox.slice(),
    get: (id) => inbox.find((m) => m.id === id),
    async attachment(id, index) {
      const msg = inbox.find((m) => m.id === id);
      const info = msg?.attachments[index];
      if (!msg || !info || !Number.isInteger(index)) return undefined;
      let content = contents.get(id)?.[index];
      if (!content && dir && ID_PATTERN.test(id)) {
        content = await readFile(path.join(messageDir(id), `attachment-${index}`)).catch(() => undefined);
      }
      return content ? { ...info, content } : undefined;
    },
    waitFor(match, timeoutMs = 5_000) {
      const found = inbox.find(match);
      if (found) return Promise.resolve(found);
      return new Promise((resolve, reject) => {
        const onMessage = (m: CaughtMessage) => {
          if (!match(m)) return;
          clearTimeout(timer);
          events.off("message", onMessage);
          resolve(m);
        };
        const timer = setTimeout(() => {
          events.off("message", onMessage);
          reject(new Error(`No matching e-mail reached the catcher within ${timeoutMs} ms`));
        }, timeoutMs);
        events.on("message", onMessage);
      });
    },
    async clear() {
      const ids = inbox.splice(0).map((m) => m.id);
      contents.clear();
      await writes;
      if (dir) for (const id of ids) await rm(messageDir(id), { recursive: true, force: true });
    },
    async close() {
      if (!listening) return;
      await listening.catch(() => {});
      if (!server.server.listening) return;
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await writes;
      listening = null;
    },
  };
}

/** Creates the catcher and listens; `port` is the real port afterwards (handy with port 0). */
export async function startMailCatcher(options: MailCatcherOptions = {}): Promise<MailCatcher> {
  const catcher = createMailCatcher(options);
  await catcher.listen();
  return catcher;
}
