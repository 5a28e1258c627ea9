import Stripe from "stripe";
import type { Delivery, Store, StripeObject } from "./store";
import { newId } from "./store";

export interface DeliveryOptions {
  webhookUrl: string;
  webhookSecret: string;
  /** First retry delay; doubles per attempt up to `maxDelayMs`. */
  retryBaseMs: number;
  maxDelayMs: number;
  log: (line: string) => void;
}

/** Stripe pins an API version on each event; ours is the installed SDK's. */
const API_VERSION = (Stripe as unknown as { API_VERSION?: string }).API_VERSION ?? "2026-10-28.endive";

/**
 * Durable webhook delivery: each event gets a queue entry persisted with the state, and is
 * re-sent with exponential backoff until the endpoint answers 2xx, across restarts of the fake.
 */
export class WebhookQueue {
  private timer: NodeJS.Timeout | null = null;
  private running: Promise<void> | null = null;
  private closed = false;

  constructor(
    private readonly store: Store,
    private readonly opts: DeliveryOptions,
  ) {}

  /** Record an event and queue it; the caller saves the store. */
  emit(type: string, object: StripeObject, previousAttributes?: Record<string, unknown>): StripeObject {
    const event: StripeObject = {
      id: newId("events"),
      object: "event",
      api_version: API_VERSION,
      created: Math.floor(Date.now() / 1000),
      data: { object: structuredClone(object), ...(previousAttributes ? { previous_attributes: previousAttributes } : {}) },
      livemode: false,
      pending_webhooks: 1,
      request: { id: null, idempotency_key: null },
      type,
    };
    this.store.insert("events", event);
    this.store.state.deliveries.push({
      eventId: event.id,
      attempts: 0,
      nextAttemptAt: Date.now(),
      deliveredAt: null,
      lastStatus: null,
      lastError: null,
    });
    this.kick();
    return event;
  }

  start(): void {
    this.closed = false;
    this.kick();
  }

  /** Stop sending; resolves when an attempt in flight has finished and been saved. */
  async stop(): Promise<void> {
    this.closed = true;
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    await this.running;
  }

  /** Make every unacknowledged delivery (or the one for `eventId`) due now. */
  redeliver(eventId?: string): number {
    let n = 0;
    for (const d of this.store.state.deliveries) {
      if (eventId ? d.eventId === eventId : d.deliveredAt === null) {
        d.nextAttemptAt = Date.now();
        if (eventId) d.deliveredAt = null;
        n += 1;
      }
    }
    this.store.save();
    this.kick();
    return n;
  }

  private kick(): void {
    if (this.closed) return;
    if (this.timer) clearTimeout(this.timer);
    this.timer = setTimeout(() => void this.tick(), 0);
  }

  private schedule(): void {
    if (this.closed) return;
    const pending = this.store.state.deliveries.filter((d) => d.deliveredAt === null);
    if (pending.length === 0) return;
    const next = Math.min(...pending.map((d) => d.nextAttemptAt));
    if (this.timer) clearTimeout(this.timer);
    this.timer = setTimeout(() => void this.tick(), Math.max(0, next - Date.now()));
  }

  private async tick(): Promise<void> {
    if (this.running || this.closed) return;
    let done!: () => void;
    this.running = new Promise<void>((r) => (done = r));
    try {
      // One at a time, oldest first: the app sees events roughly in the order they happened.
      for (;;) {
        if (this.closed) return;
        const due = this.store.state.deliveries.find((d) => d.deliveredAt === null && d.nextAttemptAt <= Date.now());
        if (!due) break;
        await this.attempt(due);
      }
    } finally {
      this.running = null;
      done();
      this.schedule();
    }
  }

  private async attempt(d: Delivery): Promise<void> {
    const event = this.store.get("events", d.eventId);
    if (!event) {
      d.deliveredAt = Date.now();
      return;
    }
    const payload = JSON.stringify(event, null, 2);
    // Signed afresh per attempt, as Stripe does: the timestamp must sit inside the tolerance.
    const signature = Stripe.webhooks.generateTestHeaderString({ payload, secret: this.opts.webhookSecret });
    d.attempts += 1;
    try {
      const res = await fetch(this.opts.webhookUrl, {
        method: "POST",
        headers: { "content-type": "application/json; charset=utf-8", "stripe-signature": signature, "user-agent": "Stripe/1.0 (+local fake)" },
        body: payload,
        signal: AbortSignal.timeout(10_000),
      });
      await res.text().catch(() => "");
      d.lastStatus = res.status;
      d.lastError = null;
      if (res.ok) d.deliveredAt = Date.now();
    } catch (e) {
      d.lastStatus = null;
      d.lastError = (e as Error).message;
    }
    if (d.deliveredAt === null) {
      const delay = Math.min(this.opts.maxDelayMs, this.opts.retryBaseMs * 2 ** (d.attempts - 1));
      d.nextAttemptAt = Date.now() + delay;
      this.opts.log(`webhook ${event.type} ${event.id} attempt ${d.attempts} failed (${d.lastStatus ?? d.lastError}); retry in ${delay} ms`);
    }
    event.pending_webhooks = d.deliveredAt === null ? 1 : 0;
    this.store.save();
  }
}
