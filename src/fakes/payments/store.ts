// The dev payments server's state: every object it made, the webhook deliveries and the
// idempotency records, in one JSON file under the data folder. Each change is written
// atomically (temp file, fsync, rename) before the request that made it is answered, so a
// restart (or a crash) keeps sessions, events and deliveries still to be sent.
import { randomUUID } from "node:crypto";
import { mkdir, open, readFile, rename } from "node:fs/promises";
import path from "node:path";
import type { Charge, CheckoutSession, Delivery, IdempotencyRecord, PaymentIntent, Refund, StripeEvent } from "./objects";

const STATE_VERSION = 1;

interface StateFile {
  version: number;
  sessions: CheckoutSession[];
  paymentIntents: PaymentIntent[];
  charges: Charge[];
  refunds: Refund[];
  events: StripeEvent[];
  deliveries: Delivery[];
  idempotency: IdempotencyRecord[];
}

/** Objects by id, in creation order (lists answer newest first). */
export class Collection<T extends { id: string }> {
  private readonly byId = new Map<string, T>();

  constructor(items: T[] = []) {
    for (const item of items) this.byId.set(item.id, item);
  }
  get(id: string): T | undefined {
    return this.byId.get(id);
  }
  add(item: T): T {
    this.byId.set(item.id, item);
    return item;
  }
  delete(id: string): void {
    this.byId.delete(id);
  }
  /** Newest first. */
  newestFirst(): T[] {
    return [...this.byId.values()].reverse();
  }
  all(): T[] {
    return [...this.byId.values()];
  }
}

export class PaymentsStore {
  readonly file: string;
  sessions = new Collection<CheckoutSession>();
  paymentIntents = new Collection<PaymentIntent>();
  charges = new Collection<Charge>();
  refunds = new Collection<Refund>();
  events = new Collection<StripeEvent>();
  deliveries = new Collection<Delivery>();
  idempotency = new Collection<IdempotencyRecord>();

  private queued: Promise<void> | null = null;
  private last: Promise<void> = Promise.resolve();

  constructor(readonly dataDir: string) {
    this.file = path.join(dataDir, "state.json");
  }

  async load(): Promise<void> {
    await mkdir(this.dataDir, { recursive: true });
    let text: string;
    try {
      text = await readFile(this.file, "utf8");
    } catch (err) {
      if ((err as { code?: string }).code === "ENOENT") return;
      throw err;
    }
    let state: StateFile;
    try {
      state = JSON.parse(text) as StateFile;
    } catch {
      throw new Error(`dev payments: ${this.file} is not valid JSON; delete the folder to start afresh.`);
    }
    if (state.version !== STATE_VERSION) {
      throw new Error(`dev payments: ${this.file} has state version ${state.version}, expected ${STATE_VERSION}; delete the folder to start afresh.`);
    }
    this.sessions = new Collection(state.sessions);
    this.paymentIntents = new Collection(state.paymentIntents);
    this.charges = new Collection(state.charges);
    this.refunds = new Collection(state.refunds);
    this.events = new Collection(state.events);
    this.deliveries = new Collection(state.deliveries);
    this.idempotency = new Collection(state.idempotency);
  }

  private snapshot(): string {
    const state: StateFile = {
      version: STATE_VERSION,
      sessions: this.sessions.all(),
      paymentIntents: this.paymentIntents.all(),
      charges: this.charges.all(),
      refunds: this.refunds.all(),
      events: this.events.all(),
      deliveries: this.deliveries.all(),
      idempotency: this.idempotency.all(),
    };
    return `${JSON.stringify(state)}\n`;
  }

  private async writeNow(): Promise<void> {
    const tmp = path.join(this.dataDir, `.state.json.${process.pid}.${randomUUID()}.tmp`);
    const handle = await open(tmp, "w");
    try {
      await handle.writeFile(this.snapshot(), "utf8");
      await handle.sync();
    } finally {
      await handle.close();
    }
    await rename(tmp, this.file);
  }

  /**
   * Resolves once a write that includes every change made before the call is on disk. Calls
   * made while a write waits to start share it; the snapshot is taken when the write starts.
   */
  save(): Promise<void> {
    if (this.queued) return this.queued;
    const run = this.last.then(() => {
      this.queued = null;
      return this.writeNow();
    });
    this.queued = run;
    this.last = run.catch(() => undefined);
    return run;
  }

  /** Waits for any write in progress (used when closing). */
  async flush(): Promise<void> {
    await this.last;
  }
}
