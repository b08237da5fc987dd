// The dev outbox: a local fake of the Resend HTTP API for the subset Kilowright uses
// (POST /emails, POST /emails/batch, GET /emails/:id), plus dev endpoints to read what was sent.
// Request and error shapes follow the service's API reference (errors are
// { statusCode, name, message }); nothing here ever leaves the machine.
//
// State lives only on disk, one JSON file per message, written atomically (temp file, fsync,
// rename), so several processes may share a directory and a restart loses nothing. The
// in-memory map is a cache of immutable files and is rebuilt from the directory on every list.
import { createHash, randomUUID } from "node:crypto";
import { mkdir, open, readFile, readdir, rename, link, unlink } from "node:fs/promises";
import { createServer, type IncomingMessage, type ServerResponse } from "node:http";
import path from "node:path";
import { z } from "zod";
import { closeServer, listenOn } from "./listen";
import { outboxMessageSchema } from "../lib/schemas/outbox";

export interface MailFakeOptions {
  /** 0 picks a free port; the real one is in the returned url. */
  port: number;
  host?: string;
  /** Where messages and idempotency records are kept; created when missing. */
  dataDir: string;
  /** The only key accepted as `Authorization: Bearer <apiKey>`. */
  apiKey: string;
}

export interface MailFake {
  /** Base URL without a trailing slash, e.g. http://127.0.0.1:4010 */
  url: string;
  close(): Promise<void>;
}

/** The stored form of one message: what the dev outbox page and tests read. */
export const storedMessageSchema = outboxMessageSchema;
export type StoredMessage = z.infer<typeof storedMessageSchema>;

// Limits as documented by the service.
const MAX_RECIPIENTS = 50;
const MAX_BATCH = 100;
const MAX_IDEMPOTENCY_KEY_CHARS = 256;
const IDEMPOTENCY_WINDOW_MS = 24 * 3600 * 1000;
const MAX_BODY_BYTES = 40 * 1024 * 1024;
const DEFAULT_LIST_LIMIT = 50;
const MAX_LIST_LIMIT = 1000;

// ---------------------------------------------------------------------------------------------
// Errors in the service's shape

type ErrorName =
  | "missing_api_key"
  | "invalid_api_key"
  | "validation_error"
  | "missing_required_field"
  | "invalid_idempotency_key"
  | "invalid_idempotent_request"
  | "invalid_parameter"
  | "not_found"
  | "method_not_allowed"
  | "content_too_large"
  | "internal_server_error";

class ApiError extends Error {
  constructor(
    readonly statusCode: number,
    readonly code: ErrorName,
    message: string,
  ) {
    super(message);
  }
  body() {
    return { statusCode: this.statusCode, name: this.code, message: this.message };
  }
}

const invalid = (message: string) => new ApiError(422, "validation_error", message);

// ---------------------------------------------------------------------------------------------
// Request validation (the JSON body as the SDK sends it: snake_case reply_to)

const BARE_ADDRESS = /^[^\s@<>(),;:"[\]]+@[A-Za-z0-9](?:[A-Za-z0-9-]*[A-Za-z0-9])?(?:\.[A-Za-z0-9](?:[A-Za-z0-9-]*[A-Za-z0-9])?)+$/;
const NAMED_ADDRESS = /^\s*(?:"[^"]*"|[^<>"]*?)\s*<([^<>\s]+)>\s*$/;

/** The bare address of `a@b.c` or `Name <a@b.c>`, lower-cased; null when neither. */
export function bareAddress(value: string): string | null {
  const named = NAMED_ADDRESS.exec(value);
  const candidate = (named ? named[1] : value).trim();
  return BARE_ADDRESS.test(candidate) ? candidate.toLowerCase() : null;
}

const address = z.string().refine((v) => bareAddress(v) !== null, {
  message: "must be a valid e-mail address or `Name <address>`",
});
const addressList = z
  .union([address, z.array(address)])
  .transform((v) => (Array.isArray(v) ? v : [v]))
  .refine((v) => v.length <= MAX_RECIPIENTS, { message: `must have at most ${MAX_RECIPIENTS} addresses` });
const TAG_PART = /^[A-Za-z0-9_-]{1,256}$/;

const sendBodySchema = z.object({
  from: address,
  to: addressList.refine((v) => v.length > 0, { message: "must have at least one address" }),
  subject: z.string().refine((v) => v.trim().length > 0, { message: "must not be empty" }),
  cc: addressList.optional(),
  bcc: addressList.optional(),
  reply_to: addressList.optional(),
  html: z.string().optional(),
  text: z.string().optional(),
  headers: z.record(z.string(), z.string()).optional(),
  tags: z
    .array(
      z.object({
        name: z.string().regex(TAG_PART, "may contain only letters, digits, _ and -"),
        value: z.string().regex(TAG_PART, "may contain only letters, digits, _ and -"),
      }),
    )
    .optional(),
  scheduled_at: z.string().optional(),
});
type SendBody = z.infer<typeof sendBodySchema>;
const REQUIRED_FIELDS = ["from", "to", "subject"] as const;

/** Validates one e-mail of a request; throws a service-shaped 422 naming the field. */
function parseSendBody(raw: unknown, where = ""): SendBody {
  if (typeof raw !== "object" || raw === null || Array.isArray(raw)) {
    throw invalid(`${where}The request body must be a JSON object.`);
  }
  const record = raw as Record<string, unknown>;
  for (const field of REQUIRED_FIELDS) {
    if (record[field] === undefined || record[field] === null || record[field] === "") {
      throw invalid(`${where}Missing \`${field}\` field.`);
    }
  }
  const parsed = sendBodySchema.safeParse(raw);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const field = issue.path.map(String).join(".") || "body";
    throw invalid(`${where}Invalid \`${field}\` field: ${issue.message}.`);
  }
  if (parsed.data.html === undefined && parsed.data.text === undefined) {
    throw invalid(`${where}Missing \`html\` or \`text\` field.`);
  }
  return parsed.data;
}

function toStored(body: SendBody, id: string, createdAt: string): StoredMessage {
  return {
    id,
    from: body.from,
    to: body.to,
    cc: body.cc ?? [],
    bcc: body.bcc ?? [],
    replyTo: body.reply_to ?? [],
    subject: body.subject,
    html: body.html ?? null,
    text: body.text ?? null,
    headers: body.headers ?? {},
    tags: body.tags ?? [],
    createdAt,
  };
}

/** GET /emails/:id answers in the service's snake_case form. */
function toApiEmail(m: StoredMessage) {
  const orNull = (list: string[]) => (list.length > 0 ? list : null);
  return {
    object: "email",
    id: m.id,
    from: m.from,
    to: m.to,
    cc: orNull(m.cc),
    bcc: orNull(m.bcc),
    reply_to: orNull(m.replyTo),
    subject: m.subject,
    html: m.html,
    text: m.text,
    created_at: m.createdAt,
    last_event: "delivered",
    scheduled_at: null,
    tags: m.tags,
  };
}

// ---------------------------------------------------------------------------------------------
// Durable storage

/** Writes `data` to a synced temporary file beside `file` and answers its path. */
async function writeSyncedTemp(file: string, data: string): Promise<string> {
  const tmp = path.join(path.dirname(file), `.${path.basename(file)}.${process.pid}.${randomUUID()}.tmp`);
  const handle = await open(tmp, "w");
  try {
    await handle.writeFile(data, "utf8");
    await handle.sync();
  } finally {
    await handle.close();
  }
  return tmp;
}

async function writeFileAtomic(file: string, data: string): Promise<void> {
  await rename(await writeSyncedTemp(file, data), file);
}

/** Like writeFileAtomic, but fails with EEXIST when the file is already there (link is exclusive). */
async function createFileExclusive(file: string, data: string): Promise<boolean> {
  const tmp = await writeSyncedTemp(file, data);
  try {
    await link(tmp, file);
    return true;
  } catch (err) {
    if (isErrno(err, "EEXIST")) return false;
    throw err;
  } finally {
    await unlink(tmp).catch(() => undefined);
  }
}

function isErrno(err: unknown, code: string): boolean {
  return typeof err === "object" && err !== null && (err as { code?: unknown }).code === code;
}

const idempotencyRecordSchema = z.object({
  endpoint: z.string(),
  bodyHash: z.string(),
  createdAt: z.iso.datetime(),
  response: z.unknown(),
  messages: z.array(storedMessageSchema),
});
type IdempotencyRecord = z.infer<typeof idempotencyRecordSchema>;

/** JSON with object keys sorted, so the same body in another key order hashes the same. */
function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(",")}]`;
  if (typeof value === "object" && value !== null) {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(",")}}`;
  }
  return JSON.stringify(value);
}

const sha256 = (s: string) => createHash("sha256").update(s).digest("hex");

class MessageStore {
  private readonly messagesDir: string;
  private readonly idempotencyDir: string;
  /** Cache of parsed message files; files never change once written. */
  private readonly cache = new Map<string, StoredMessage>();

  constructor(dataDir: string) {
    this.messagesDir = path.join(dataDir, "messages");
    this.idempotencyDir = path.join(dataDir, "idempotency");
  }

  async init(): Promise<void> {
    await mkdir(this.messagesDir, { recursive: true });
    await mkdir(this.idempotencyDir, { recursive: true });
  }

  private fileOf(id: string): string {
    return path.join(this.messagesDir, `${id}.json`);
  }

  async save(messages: StoredMessage[]): Promise<void> {
    for (const m of messages) {
      await writeFileAtomic(this.fileOf(m.id), `${JSON.stringify(m, null, 2)}\n`);
      this.cache.set(m.id, m);
    }
  }

  async get(id: string): Promise<StoredMessage | null> {
    const cached = this.cache.get(id);
    if (cached) {
      // Another process may have cleared the directory; the file is the truth.
      if (await this.readMessage(id)) return cached;
      this.cache.delete(id);
      return null;
    }
    return this.readMessage(id);
  }

  private async readMessage(id: string): Promise<StoredMessage | null> {
    let text: string;
    try {
      text = await readFile(this.fileOf(id), "utf8");
    } catch (err) {
      if (isErrno(err, "ENOENT")) return null;
      throw err;
    }
    const parsed = storedMessageSchema.safeParse(JSON.parse(text));
    if (!parsed.success) return null;
    this.cache.set(id, parsed.data);
    return parsed.data;
  }

  /** Every stored message, newest first. */
  async list(): Promise<StoredMessage[]> {
    const names = (await readdir(this.messagesDir)).filter((n) => n.endsWith(".json") && !n.startsWith("."));
    const ids = new Set(names.map((n) => n.slice(0, -".json".length)));
    for (const id of this.cache.keys()) if (!ids.has(id)) this.cache.delete(id);
    const out: StoredMessage[] = [];
    for (const id of ids) {
      const m = this.cache.get(id) ?? (await this.readMessage(id));
      if (m) out.push(m);
    }
    return out.sort((a, b) => (a.createdAt < b.createdAt ? 1 : a.createdAt > b.createdAt ? -1 : 0));
  }

  async clear(): Promise<number> {
    let deleted = 0;
    for (const name of await readdir(this.messagesDir)) {
      if (!name.endsWith(".json") || name.startsWith(".")) continue;
      await unlink(path.join(this.messagesDir, name)).catch(() => undefined);
      deleted++;
    }
    for (const name of await readdir(this.idempotencyDir)) {
      if (name.endsWith(".json")) await unlink(path.join(this.idempotencyDir, name)).catch(() => undefined);
    }
    this.cache.clear();
    return deleted;
  }

  private idempotencyFile(endpoint: string, key: string): string {
    return path.join(this.idempotencyDir, `${sha256(`${endpoint}\n${key}`)}.json`);
  }

  private async readRecord(file: string): Promise<IdempotencyRecord | null> {
    try {
      const parsed = idempotencyRecordSchema.safeParse(JSON.parse(await readFile(file, "utf8")));
      return parsed.success ? parsed.data : null;
    } catch (err) {
      if (isErrno(err, "ENOENT")) return null;
      throw err;
    }
  }

  /**
   * Runs `create` once per (endpoint, key, body) within the window. The record, with the
   * messages it made, is claimed before the message files are written, so a concurrent request
   * or a retry after a crash replays it (and rewrites any message file that is missing).
   */
  async idempotent(
    endpoint: string,
    key: string,
    body: unknown,
    create: () => { response: unknown; messages: StoredMessage[] },
  ): Promise<unknown> {
    const file = this.idempotencyFile(endpoint, key);
    const bodyHash = sha256(canonicalJson(body));
    for (let attempt = 0; attempt < 3; attempt++) {
      const existing = await this.readRecord(file);
      const fresh = existing && Date.now() - Date.parse(existing.createdAt) < IDEMPOTENCY_WINDOW_MS;
      if (existing && fresh) {
        if (existing.bodyHash !== bodyHash) {
          throw new ApiError(
            409,
            "invalid_idempotent_request",
            "Same idempotency key used with a different request payload. Change your idempotency key or payload.",
          );
        }
        const missing: StoredMessage[] = [];
        for (const m of existing.messages) if (!(await this.readMessage(m.id))) missing.push(m);
        await this.save(missing);
        return existing.response;
      }
      const made = create();
      const record: IdempotencyRecord = {
        endpoint,
        bodyHash,
        createdAt: new Date().toISOString(),
        response: made.response,
        messages: made.messages,
      };
      const data = `${JSON.stringify(record)}\n`;
      let claimed: boolean;
      if (existing) {
        // An expired record is simply replaced.
        await writeFileAtomic(file, data);
        claimed = true;
      } else {
        claimed = await createFileExclusive(file, data);
      }
      if (claimed) {
        await this.save(made.messages);
        return made.response;
      }
      // Another request claimed the key first: loop and replay its record.
    }
    throw new ApiError(409, "invalid_idempotent_request", "The idempotency key is being used by another request; retry.");
  }
}

// ---------------------------------------------------------------------------------------------
// HTTP

function sendJson(res: ServerResponse, status: number, body: unknown): void {
  const text = JSON.stringify(body);
  res.writeHead(status, { "content-type": "application/json; charset=utf-8", "content-length": Buffer.byteLength(text) });
  res.end(text);
}

async function readBody(req: IncomingMessage): Promise<string> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of req) {
    const buf = Buffer.isBuffer(chunk) ? chunk : Buffer.from(String(chunk));
    size += buf.length;
    if (size > MAX_BODY_BYTES) throw new ApiError(413, "content_too_large", "The request body is larger than 40 MB.");
    chunks.push(buf);
  }
  return Buffer.concat(chunks).toString("utf8");
}

async function readJson(req: IncomingMessage): Promise<unknown> {
  const text = await readBody(req);
  try {
    return JSON.parse(text) as unknown;
  } catch {
    throw new ApiError(400, "validation_error", "The request body must be valid JSON.");
  }
}

function checkAuth(req: IncomingMessage, apiKey: string): void {
  const header = req.headers.authorization;
  const match = header ? /^Bearer\s+(\S+)\s*$/i.exec(header) : null;
  if (!match) {
    throw new ApiError(
      401,
      "missing_api_key",
      "Missing API key in the authorization header. Include the header `Authorization: Bearer YOUR_API_KEY`.",
    );
  }
  const given = Buffer.from(sha256(match[1]));
  const expected = Buffer.from(sha256(apiKey));
  if (!given.equals(expected)) throw new ApiError(403, "invalid_api_key", "API key is invalid.");
}

function idempotencyKeyOf(req: IncomingMessage): string | null {
  const raw = req.headers["idempotency-key"];
  if (raw === undefined) return null;
  const key = Array.isArray(raw) ? raw[0] : raw;
  if (key.length < 1 || key.length > MAX_IDEMPOTENCY_KEY_CHARS) {
    throw new ApiError(400, "invalid_idempotency_key", `The key must be between 1-${MAX_IDEMPOTENCY_KEY_CHARS} chars.`);
  }
  return key;
}

const UUID = z.uuid();
const listQuerySchema = z.object({
  to: z.string().optional(),
  /** Only messages tagged `company_id` = this value (the app tags every message with its company). */
  company: z.string().regex(TAG_PART, "may contain only letters, digits, _ and -").optional(),
  limit: z.coerce.number().int().min(1).max(MAX_LIST_LIMIT).default(DEFAULT_LIST_LIMIT),
});

/** POST /dev/faults: refuse the next `refuseNext` sends (POST /emails, /emails/batch) with this status. */
const faultsSchema = z.object({
  refuseNext: z.number().int().min(0).max(1_000_000),
  statusCode: z.union([z.literal(429), z.literal(500), z.literal(503)]).default(503),
});

/** Message ids: random UUIDs; createdAt strictly increases within a process so order is stable. */
function makeClock() {
  let last = 0;
  return () => {
    last = Math.max(Date.now(), last + 1);
    return new Date(last).toISOString();
  };
}

/** The outbox's state: its store, its clock, its key and the sends still to refuse (POST /dev/faults, memory only). */
type Outbox = { store: MessageStore; now: () => string; apiKey: string; refuseNext: number; refuseStatus: number };

const notAllowed = () => new ApiError(405, "method_not_allowed", "Method is not allowed for the requested path.");

/** POST /emails, GET /emails/:id, POST /emails/batch: the service's own API. */
async function handleEmails(o: Outbox, req: IncomingMessage, res: ServerResponse, parts: string[], method: string): Promise<void> {
  checkAuth(req, o.apiKey);
  if (method === "POST" && o.refuseNext > 0) {
    o.refuseNext -= 1;
    await readBody(req);
    throw new ApiError(o.refuseStatus, "internal_server_error", "The dev outbox refused this send on purpose (POST /dev/faults).");
  }
  if (parts.length === 1) {
    if (method !== "POST") throw notAllowed();
    const key = idempotencyKeyOf(req);
    const body = parseSendBody(await readJson(req));
    const create = () => {
      const message = toStored(body, randomUUID(), o.now());
      return { response: { id: message.id }, messages: [message] };
    };
    if (key) return sendJson(res, 200, await o.store.idempotent("/emails", key, body, create));
    const made = create();
    await o.store.save(made.messages);
    return sendJson(res, 200, made.response);
  }
  if (parts[1] === "batch") {
    if (method !== "POST") throw notAllowed();
    const key = idempotencyKeyOf(req);
    const raw = await readJson(req);
    if (!Array.isArray(raw)) throw invalid("The request body must be an array of e-mails.");
    if (raw.length === 0) throw invalid("The batch must contain at least one e-mail.");
    if (raw.length > MAX_BATCH) throw invalid(`The batch must contain at most ${MAX_BATCH} e-mails.`);
    const permissive = String(req.headers["x-batch-validation"] ?? "strict").toLowerCase() === "permissive";
    const valid: SendBody[] = [];
    const errors: { index: number; message: string }[] = [];
    raw.forEach((item: unknown, index) => {
      try {
        valid.push(parseSendBody(item, `E-mail ${index}: `));
      } catch (err) {
        if (!permissive || !(err instanceof ApiError)) throw err;
        errors.push({ index, message: err.message });
      }
    });
    const create = () => {
      const messages = valid.map((b) => toStored(b, randomUUID(), o.now()));
      const data = messages.map((m) => ({ id: m.id }));
      return { response: permissive ? { data, errors } : { data }, messages };
    };
    if (key) return sendJson(res, 200, await o.store.idempotent("/emails/batch", key, raw, create));
    const made = create();
    await o.store.save(made.messages);
    return sendJson(res, 200, made.response);
  }
  if (method !== "GET") throw notAllowed();
  if (!UUID.safeParse(parts[1]).success) throw new ApiError(422, "invalid_parameter", "The `id` must be a valid UUID.");
  const found = await o.store.get(parts[1]);
  if (!found) throw new ApiError(404, "not_found", "Email not found.");
  return sendJson(res, 200, toApiEmail(found));
}

/** The dev endpoints (not part of the service): /dev/faults and /dev/messages. Answers false for any other path. */
async function handleDev(o: Outbox, req: IncomingMessage, res: ServerResponse, url: URL, parts: string[], method: string): Promise<boolean> {
  if (parts[0] === "dev" && parts[1] === "faults" && parts.length === 2) {
    checkAuth(req, o.apiKey);
    if (method === "DELETE") {
      o.refuseNext = 0;
      sendJson(res, 200, { refuseNext: o.refuseNext });
      return true;
    }
    if (method !== "POST") throw notAllowed();
    const parsed = faultsSchema.safeParse(await readJson(req));
    if (!parsed.success) throw invalid(`Invalid faults: ${parsed.error.issues[0].message}.`);
    o.refuseNext = parsed.data.refuseNext;
    o.refuseStatus = parsed.data.statusCode;
    sendJson(res, 200, parsed.data);
    return true;
  }
  if (parts[0] === "dev" && parts[1] === "messages" && parts.length <= 3) {
    checkAuth(req, o.apiKey);
    if (parts.length === 2) {
      if (method === "DELETE") {
        sendJson(res, 200, { deleted: await o.store.clear() });
        return true;
      }
      if (method !== "GET") throw notAllowed();
      const query = listQuerySchema.safeParse(Object.fromEntries(url.searchParams));
      if (!query.success) {
        const issue = query.error.issues[0];
        throw invalid(`Invalid \`${issue.path.map(String).join(".")}\` parameter: ${issue.message}.`);
      }
      const wanted = query.data.to === undefined ? null : bareAddress(query.data.to);
      if (query.data.to !== undefined && wanted === null) throw invalid("Invalid `to` parameter: not an e-mail address.");
      const all = await o.store.list();
      const company = query.data.company;
      const matching = all.filter(
        (m) =>
          (wanted === null || [...m.to, ...m.cc, ...m.bcc].some((a) => bareAddress(a) === wanted)) &&
          (company === undefined || m.tags.some((t) => t.name === "company_id" && t.value === company)),
      );
      sendJson(res, 200, { data: matching.slice(0, query.data.limit) });
      return true;
    }
    if (method !== "GET") throw notAllowed();
    if (!UUID.safeParse(parts[2]).success) throw new ApiError(422, "invalid_parameter", "The `id` must be a valid UUID.");
    const found = await o.store.get(parts[2]);
    if (!found) throw new ApiError(404, "not_found", "Message not found.");
    sendJson(res, 200, found);
    return true;
  }
  return false;
}

async function handle(o: Outbox, req: IncomingMessage, res: ServerResponse): Promise<void> {
  const url = new URL(req.url ?? "/", "http://fake.invalid");
  const parts = url.pathname.split("/").filter(Boolean);
  const method = req.method ?? "GET";
  if (url.pathname === "/health") {
    if (method !== "GET") throw notAllowed();
    return sendJson(res, 200, { ok: true });
  }
  if (parts[0] === "emails" && parts.length <= 2) return handleEmails(o, req, res, parts, method);
  if (await handleDev(o, req, res, url, parts, method)) return;
  throw new ApiError(404, "not_found", "The requested endpoint does not exist.");
}

export async function startMailFake({ port, host = "127.0.0.1", dataDir, apiKey }: MailFakeOptions): Promise<MailFake> {
  if (!apiKey) throw new Error("startMailFake: apiKey is required");
  const store = new MessageStore(path.resolve(dataDir));
  await store.init();
  const now = makeClock();
  // Sends still to refuse (POST /dev/faults), so tests can show the app retries.
  const outbox: Outbox = { store, now, apiKey, refuseNext: 0, refuseStatus: 503 };

  const server = createServer((req, res) => {
    handle(outbox, req, res).catch((err: unknown) => {
      if (err instanceof ApiError) return sendJson(res, err.statusCode, err.body());
      console.error("dev outbox: unexpected error", err);
      if (!res.headersSent) {
        sendJson(res, 500, { statusCode: 500, name: "internal_server_error", message: "The dev outbox failed; see its log." });
      } else {
        res.destroy();
      }
    });
  });

  return { url: await listenOn(server, port, host), close: () => closeServer(server) };
}
