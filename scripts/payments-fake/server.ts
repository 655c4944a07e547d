// A local fake of the payment service: exactly the endpoints and events Loadframe uses, with the
// shapes the official SDK reads, on loopback (docs/decisions/180-payments-through-the-sdk-and-a-local-fake.md).
// Requests are form-encoded with bracket keys (line_items[0][price]) as the SDK sends them; answers
// are the service's JSON objects; errors are { error: { type, message } }. Webhooks are signed as
// the SDK verifies them: header `t=<unix s>,v1=<hex HMAC-SHA256(secret, "<t>.<body>")>`.
// Beside the API: hosted pages (/pay/:session, /invoice/:id) and a few /_fake/ controls for tests
// (renew a subscription now, hold and release webhooks, read what was sent).
import { createHmac, randomBytes } from "node:crypto";
import { readFileSync, writeFileSync } from "node:fs";
import type { AddressInfo } from "node:net";
import type { Server } from "node:http";
import express, { type Request, type Response } from "express";
import type Stripe from "stripe";
import { chargesLater, digitsOf, outcomeOf } from "./cards";
import { authenticatePage, cardPage, messagePage } from "./pages";

export interface FakeOptions {
  port?: number;
  host?: string;
  /** The secret API key the SDK must send (Authorization: Bearer …). */
  apiKey: string;
  webhookSecret: string;
  /** Where events are POSTed; none: events are only recorded. */
  webhookUrl?: string;
  /** The address browsers reach the hosted pages at (default: the listening address). */
  publicUrl?: string;
  /** Keep the state in this JSON file across restarts (scripts/start). */
  stateFile?: string;
  /** Prices to offer: id → monthly amount in cents. */
  prices: Record<string, { unitAmount: number; currency?: string; product?: string }>;
}

// The service's own types: the fake fills the fields Loadframe and the SDK read, and says so with
// one cast where each object is made.
type Session = Stripe.Checkout.Session & { price_id: string; pending_card?: string; subscription_data_metadata: Stripe.Metadata };
interface Delivery { eventId: string; type: string; payload: string; signature: string; status: number | null; attempts: number }
interface State {
  clockOffset: number;
  customers: Record<string, Stripe.Customer>;
  sessions: Record<string, Session>;
  subscriptions: Record<string, Stripe.Subscription>;
  invoices: Record<string, Stripe.Invoice>;
  /** The card on file per customer (digits; the fake keeps no other card data). */
  cards: Record<string, string>;
  events: Stripe.Event[];
  invoiceSeq: number;
}

const PERIOD_S = 30 * 24 * 3600;
const newId = (prefix: string) => `${prefix}_${randomBytes(12).toString("base64url").replace(/[-_]/g, "x")}`;

export function signatureHeader(payload: string, secret: string, timestamp = Math.floor(Date.now() / 1000)) {
  const v1 = createHmac("sha256", secret).update(`${timestamp}.${payload}`).digest("hex");
  return `t=${timestamp},v1=${v1}`;
}

export interface PaymentsFake {
  url: string;
  /** Where events go from now on (a test learns its app's port after starting the fake). */
  setWebhookUrl: (url: string) => void;
  close: () => Promise<void>;
  /** Every event made, with its deliveries (tests read these to replay one). */
  deliveries: () => Delivery[];
  /** Resolves when every queued delivery has been attempted to the end. */
  idle: () => Promise<void>;
}

export async function startPaymentsFake(opts: FakeOptions): Promise<PaymentsFake> {
  const fresh = (): State => ({ clockOffset: 0, customers: {}, sessions: {}, subscriptions: {}, invoices: {}, cards: {}, events: [], invoiceSeq: 0 });
  let st: State = fresh();
  if (opts.stateFile) {
    try {
      st = { ...fresh(), ...JSON.parse(readFileSync(opts.stateFile, "utf8")) };
    } catch { /* first start */ }
  }
  const save = () => opts.stateFile && writeFileSync(opts.stateFile, JSON.stringify(st));
  const now = () => Math.floor(Date.now() / 1000) + st.clockOffset;
  let publicUrl = opts.publicUrl ?? "";

  const priceObj = (id: string): Stripe.Price | null => {
    const p = opts.prices[id];
    if (!p) return null;
    return { id, object: "price", active: true, currency: p.currency ?? "usd", unit_amount: p.unitAmount, recurring: { interval: "month", interval_count: 1 },
      product: p.product ?? `prod_${id}`, type: "recurring", livemode: false, lookup_key: null, metadata: {} } as unknown as Stripe.Price;
  };

  // --- webhooks: one queue, in order, retried; can be held and released (reversed) by tests ---
  const deliveries: Delivery[] = [];
  let held: Delivery[] | null = null;
  let chain = Promise.resolve();
  const send = (d: Delivery) => {
    chain = chain.then(async () => {
      if (!opts.webhookUrl) return;
      for (let attempt = 1; attempt <= 4; attempt++) {
        d.attempts = attempt;
        d.signature = signatureHeader(d.payload, opts.webhookSecret);
        try {
          const r = await fetch(opts.webhookUrl, { method: "POST", headers: { "content-type": "application/json", "stripe-signature": d.signature }, body: d.payload });
          d.status = r.status;
          await r.arrayBuffer();
          if (r.ok) return;
        } catch {
          d.status = null;
        }
        await new Promise((r) => setTimeout(r, 250 * 2 ** attempt));
      }
    });
  };
  function emit(type: string, object: object, previous?: object) {
    const event = { id: newId("evt"), object: "event", api_version: "2026-10-28.endive", created: now(), livemode: false, pending_webhooks: 1,
      request: { id: null, idempotency_key: null }, type, data: { object: structuredClone(object), ...(previous ? { previous_attributes: previous } : {}) } } as unknown as Stripe.Event;
    st.events.push(event);
    const d: Delivery = { eventId: event.id, type, payload: JSON.stringify(event, null, 2), signature: "", status: null, attempts: 0 };
    deliveries.push(d);
    if (held) held.push(d);
    else send(d);
  }

  // --- money ---
  const customerOf = (x: { customer: string | Stripe.Customer | Stripe.DeletedCustomer | null }) => st.customers[x.customer as string]!;
  function newInvoice(sub: Stripe.Subscription, amount: number, reason: Stripe.Invoice.BillingReason, description: string): Stripe.Invoice {
    const cust = customerOf(sub);
    // A credit left by a downgrade is used first.
    const credit = Math.min(Math.max(-cust.balance, 0), Math.max(amount, 0));
    cust.balance += credit;
    const due = Math.max(amount - credit, 0);
    if (amount < 0) cust.balance += amount;
    const id = newId("in");
    const item = sub.items.data[0];
    const inv = {
      id, object: "invoice", customer: sub.customer, livemode: false, created: now(), currency: item.price.currency,
      number: `LFK-${String(++st.invoiceSeq).padStart(4, "0")}`, billing_reason: reason, collection_method: "charge_automatically",
      status: "open", amount_due: due, amount_paid: 0, amount_remaining: due, subtotal: amount, total: amount, attempt_count: 0, attempted: false,
      period_start: item.current_period_start, period_end: item.current_period_end, description,
      hosted_invoice_url: `${publicUrl}/invoice/${id}`, invoice_pdf: null, next_payment_attempt: null,
      parent: { type: "subscription_details", quote_details: null, subscription_details: { subscription: sub.id, metadata: sub.metadata } },
      lines: { object: "list", data: [{ id: newId("il"), object: "line_item", amount, currency: item.price.currency, description,
        period: { start: item.current_period_start, end: item.current_period_end }, pricing: { price_details: { price: item.price.id } } }], has_more: false, url: `/v1/invoices/${id}/lines` },
      status_transitions: { finalized_at: now(), paid_at: null, voided_at: null, marked_uncollectible_at: null }, metadata: {},
    } as unknown as Stripe.Invoice;
    st.invoices[id] = inv;
    sub.latest_invoice = id;
    return inv;
  }
  function markPaid(inv: Stripe.Invoice) {
    inv.status = "paid";
    inv.amount_paid = inv.amount_due;
    inv.amount_remaining = 0;
    inv.attempted = true;
    inv.attempt_count += 1;
    inv.status_transitions.paid_at = now();
    inv.next_payment_attempt = null;
  }
  /** Charge the card on file without the cardholder (renewals, prorations). */
  function chargeOffSession(inv: Stripe.Invoice): boolean {
    if (inv.amount_due === 0 || chargesLater(st.cards[inv.customer as string])) {
      markPaid(inv);
      emit("invoice.paid", inv);
      return true;
    }
    inv.attempted = true;
    inv.attempt_count += 1;
    inv.next_payment_attempt = now() + 3 * 24 * 3600;
    emit("invoice.payment_failed", inv);
    return false;
  }
  function setStatus(sub: Stripe.Subscription, status: Stripe.Subscription.Status) {
    if (sub.status === status) return;
    const previous = { status: sub.status };
    sub.status = status;
    emit("customer.subscription.updated", sub, previous);
  }

  // --- the API ---
  const app = express();
  app.disable("x-powered-by");
  const api = express.Router();
  const fail = (res: Response, status: number, message: string, param?: string) =>
    res.status(status).json({ error: { type: "invalid_request_error", message, ...(param ? { param } : {}) } });
  api.use((req, res, next) => {
    if (req.get("authorization") !== `Bearer ${opts.apiKey}`) return void res.status(401).json({ error: { type: "invalid_request_error", message: "Invalid API Key provided." } });
    next();
  });
  api.use(express.urlencoded({ extended: true, limit: "100kb" }));
  // The SDK retries with the same Idempotency-Key: answer it with the first answer.
  const idem = new Map<string, { status: number; body: unknown }>();
  api.use((req, res, next) => {
    const key = req.method === "POST" ? req.get("idempotency-key") : undefined;
    if (!key) return next();
    const seen = idem.get(key);
    if (seen) return void res.status(seen.status).json(seen.body);
    const json = res.json.bind(res);
    res.json = (body: unknown) => {
      idem.set(key, { status: res.statusCode, body });
      save();
      return json(body);
    };
    next();
  });
  const list = <T>(url: string, data: T[], limit: unknown) => {
    const n = Math.min(Math.max(Number(limit ?? 10) || 10, 1), 100);
    return { object: "list", url, has_more: data.length > n, data: data.slice(0, n) };
  };
  /** Newest first; within one second, the later made first (the store keeps the order they were made in). */
  const newestFirst = <T extends { created: number }>(made: T[]) => [...made].reverse().sort((a, b) => b.created - a.created);

  api.post("/customers", (req, res) => {
    const id = newId("cus");
    const c = { id, object: "customer", created: now(), email: req.body.email ?? null, name: req.body.name ?? null, metadata: req.body.metadata ?? {},
      balance: 0, currency: "usd", delinquent: false, livemode: false, invoice_settings: { default_payment_method: null } } as unknown as Stripe.Customer;
    st.customers[id] = c;
    res.json(c);
  });
  api.get("/customers/:id", (req, res) => {
    const c = st.customers[String(req.params.id)];
    if (!c) return void fail(res, 404, `No such customer: '${req.params.id}'`, "id");
    res.json(c);
  });

  api.post("/checkout/sessions", (req, res) => {
    const b = req.body;
    if (b.mode !== "subscription") return void fail(res, 400, "The fake supports mode=subscription only.", "mode");
    const customer = st.customers[b.customer];
    if (!customer) return void fail(res, 400, `No such customer: '${b.customer}'`, "customer");
    const item = b.line_items?.[0];
    const price = item && priceObj(item.price);
    if (!price) return void fail(res, 400, `No such price: '${item?.price}'`, "line_items[0][price]");
    if (!b.success_url || !b.cancel_url) return void fail(res, 400, "Missing required param: success_url / cancel_url.", "success_url");
    const id = newId("cs_test");
    const s = { id, object: "checkout.session", mode: "subscription", status: "open", payment_status: "unpaid", customer: customer.id, customer_email: customer.email,
      client_reference_id: b.client_reference_id ?? null, metadata: b.metadata ?? {}, success_url: b.success_url, cancel_url: b.cancel_url,
      url: `${publicUrl}/pay/${id}`, subscription: null, invoice: null, created: now(), expires_at: now() + 24 * 3600, livemode: false,
      amount_total: price.unit_amount * Number(item.quantity ?? 1), currency: price.currency,
      subscription_data_metadata: b.subscription_data?.metadata ?? {}, price_id: price.id } as unknown as Session;
    st.sessions[id] = s;
    res.json(publicSession(s));
  });
  const publicSession = (s: Session) => {
    const { subscription_data_metadata: _m, price_id: _p, pending_card: _c, ...rest } = s;
    return rest;
  };
  api.get("/checkout/sessions/:id", (req, res) => {
    const s = st.sessions[String(req.params.id)];
    if (!s) return void fail(res, 404, `No such checkout.session: '${req.params.id}'`, "id");
    res.json(publicSession(s));
  });

  api.get("/subscriptions", (req, res) => {
    const status = String(req.query.status ?? "");
    let subs = Object.values(st.subscriptions).filter((s) => !req.query.customer || s.customer === req.query.customer);
    if (status !== "all") subs = subs.filter((s) => (status ? s.status === status : s.status !== "canceled"));
    res.json(list("/v1/subscriptions", newestFirst(subs), req.query.limit));
  });
  api.get("/subscriptions/:id", (req, res) => {
    const s = st.subscriptions[String(req.params.id)];
    if (!s) return void fail(res, 404, `No such subscription: '${req.params.id}'`, "id");
    res.json(s);
  });
  api.post("/subscriptions/:id", (req, res) => {
    const sub = st.subscriptions[String(req.params.id)];
    if (!sub) return void fail(res, 404, `No such subscription: '${req.params.id}'`, "id");
    if (sub.status === "canceled") return void fail(res, 400, "A canceled subscription can only update its cancellation_details and metadata.");
    const b = req.body;
    const previous: Record<string, unknown> = {};
    const newItem = b.items?.[0];
    let proration: number | null = null;
    if (newItem) {
      const item = sub.items.data[0];
      if (newItem.id !== item.id) return void fail(res, 400, `No such subscription item: '${newItem.id}'`, "items[0][id]");
      const price = priceObj(newItem.price);
      if (!price) return void fail(res, 400, `No such price: '${newItem.price}'`, "items[0][price]");
      if (price.id !== item.price.id) {
        proration = prorationOf(sub, price);
        previous.items = structuredClone(sub.items);
        item.price = price;
      }
    }
    if (b.cancel_at_period_end !== undefined) {
      const v = b.cancel_at_period_end === "true";
      if (v !== sub.cancel_at_period_end) {
        previous.cancel_at_period_end = sub.cancel_at_period_end;
        sub.cancel_at_period_end = v;
        sub.cancel_at = v ? sub.items.data[0].current_period_end : null;
        sub.canceled_at = v ? now() : null;
      }
    }
    if (Object.keys(previous).length) emit("customer.subscription.updated", sub, previous);
    const behaviour = b.proration_behavior ?? "create_prorations";
    if (proration !== null && proration !== 0 && behaviour !== "none") {
      if (behaviour === "always_invoice") {
        const inv = newInvoice(sub, proration, "subscription_update", `Change to ${sub.items.data[0].price.id} for the rest of the period`);
        if (!chargeOffSession(inv)) setStatus(sub, "past_due");
      } else {
        customerOf(sub).balance += proration; // billed (or credited) with the next renewal
      }
    }
    res.json(sub);
  });
  function prorationOf(sub: Stripe.Subscription, price: Stripe.Price, at = now()) {
    const item = sub.items.data[0];
    const span = item.current_period_end - item.current_period_start;
    const left = Math.min(Math.max(item.current_period_end - at, 0), span) / span;
    return Math.round(((price.unit_amount ?? 0) - (item.price.unit_amount ?? 0)) * left);
  }

  api.get("/invoices", (req, res) => {
    const invs = Object.values(st.invoices).filter((i) => (!req.query.customer || i.customer === req.query.customer)
      && (!req.query.subscription || i.parent?.subscription_details?.subscription === req.query.subscription));
    res.json(list("/v1/invoices", newestFirst(invs), req.query.limit));
  });
  api.post("/invoices/create_preview", (req, res) => {
    const b = req.body;
    const sub = st.subscriptions[b.subscription];
    if (!sub || sub.customer !== b.customer) return void fail(res, 400, `No such subscription: '${b.subscription}'`, "subscription");
    const it = b.subscription_details?.items?.[0];
    const price = it && priceObj(it.price);
    if (!price) return void fail(res, 400, "Preview needs subscription_details[items][0][price].", "subscription_details");
    const amount = prorationOf(sub, price, Number(b.subscription_details?.proration_date) || now());
    const credit = Math.max(-customerOf(sub).balance, 0);
    res.json({ id: `upcoming_${newId("in")}`, object: "invoice", customer: sub.customer, currency: price.currency, livemode: false, created: now(),
      subtotal: amount, total: amount, amount_due: Math.max(amount - credit, 0), amount_paid: 0, amount_remaining: Math.max(amount - credit, 0), status: "draft",
      lines: { object: "list", data: [], has_more: false, url: "/v1/invoices/upcoming/lines" } });
  });
  app.use("/v1", api);

  // --- hosted pages ---
  const pages = express.Router();
  pages.use(express.urlencoded({ extended: false, limit: "10kb" }));
  const sessionOr404 = (req: Request, res: Response) => {
    const s = st.sessions[String(req.params.id)];
    if (!s) res.status(404).send(messagePage("Not found", "This payment page does not exist."));
    return s;
  };
  const checkoutForm = (s: Session, error?: string) =>
    cardPage({ title: "Subscribe", lineItem: `Monthly plan (${s.price_id})`, amountCents: s.amount_total ?? 0, currency: s.currency ?? "usd", action: `/pay/${s.id}`, error, cancelUrl: s.cancel_url, email: s.customer_email });
  const successUrl = (s: Session) => (s.success_url ?? "/").replace("{CHECKOUT_SESSION_ID}", s.id);

  pages.get("/pay/:id", (req, res) => {
    const s = sessionOr404(req, res);
    if (!s) return;
    if (s.status === "complete") return void res.redirect(303, successUrl(s));
    if (s.expires_at < now()) return void res.send(messagePage("This page has expired", "Start the checkout again from the app.", { url: s.cancel_url ?? "/", label: "Go back" }));
    res.send(checkoutForm(s));
  });
  pages.post("/pay/:id", (req, res) => {
    const s = sessionOr404(req, res);
    if (!s) return;
    if (s.status === "complete") return void res.redirect(303, successUrl(s));
    const card = digitsOf(String(req.body.card ?? ""));
    const problem = cardProblem(card, req.body);
    if (problem) return void res.status(402).send(checkoutForm(s, problem));
    if (outcomeOf(card) === "authenticate") {
      s.pending_card = card;
      save();
      return void res.redirect(303, `/pay/${s.id}/authenticate`);
    }
    completeCheckout(s, card);
    res.redirect(303, successUrl(s));
  });
  pages.get("/pay/:id/authenticate", (req, res) => {
    const s = sessionOr404(req, res);
    if (!s) return;
    if (!s.pending_card) return void res.redirect(303, `/pay/${s.id}`);
    res.send(authenticatePage({ action: `/pay/${s.id}/authenticate`, amountCents: s.amount_total ?? 0, currency: s.currency ?? "usd" }));
  });
  pages.post("/pay/:id/authenticate", (req, res) => {
    const s = sessionOr404(req, res);
    if (!s) return;
    const card = s.pending_card;
    delete s.pending_card;
    if (!card || s.status === "complete") return void res.redirect(303, `/pay/${s.id}`);
    if (req.body.result !== "complete") {
      save();
      return void res.status(402).send(checkoutForm(s, "We could not authenticate your payment method. Choose another payment method and try again."));
    }
    completeCheckout(s, card);
    res.redirect(303, successUrl(s));
  });
  function cardProblem(card: string, body: Record<string, unknown>): string | null {
    const o = outcomeOf(card);
    if (o === "invalid") return "Your card number is incomplete or not a number.";
    if (o === "not_test_card") return "Your card was declined. This is a test page: use one of the test card numbers below.";
    if (!/^\s*(0[1-9]|1[0-2])\s*\/\s*\d{2}\s*$/.test(String(body.expiry ?? ""))) return "Your card's expiry date is incomplete (MM/YY).";
    if (!/^\d{3,4}$/.test(String(body.cvc ?? "").trim())) return "Your card's security code is incomplete.";
    if (o === "declined") return "Your card was declined.";
    return null;
  }
  function completeCheckout(s: Session, card: string) {
    const price = priceObj(s.price_id)!;
    const t = now();
    const subId = newId("sub");
    const sub = {
      id: subId, object: "subscription", customer: s.customer, status: "active", created: t, start_date: t, livemode: false,
      cancel_at_period_end: false, cancel_at: null, canceled_at: null, ended_at: null, collection_method: "charge_automatically", currency: price.currency,
      metadata: s.subscription_data_metadata ?? {}, latest_invoice: null, default_payment_method: null,
      items: { object: "list", has_more: false, url: `/v1/subscription_items?subscription=${subId}`,
        data: [{ id: newId("si"), object: "subscription_item", price, quantity: 1, subscription: subId, created: t, current_period_start: t, current_period_end: t + PERIOD_S }] },
    } as unknown as Stripe.Subscription;
    st.subscriptions[subId] = sub;
    st.cards[s.customer as string] = card;
    const inv = newInvoice(sub, price.unit_amount ?? 0, "subscription_create", `1 × ${price.id}`);
    markPaid(inv);
    Object.assign(s, { status: "complete", payment_status: "paid", subscription: subId, invoice: inv.id });
    emit("customer.subscription.created", sub);
    emit("invoice.paid", inv);
    emit("checkout.session.completed", publicSession(s));
    save();
  }

  const invoiceForm = (inv: Stripe.Invoice, error?: string) =>
    cardPage({ title: `Invoice ${inv.number}`, lineItem: inv.description ?? "", amountCents: inv.amount_remaining, currency: inv.currency, action: `/invoice/${inv.id}`, error });
  pages.get("/invoice/:id", (req, res) => {
    const inv = st.invoices[String(req.params.id)];
    if (!inv) return void res.status(404).send(messagePage("Not found", "This invoice does not exist."));
    if (inv.status !== "open") return void res.send(messagePage(`Invoice ${inv.number}`, `This invoice is ${inv.status}. Nothing more to pay.`));
    res.send(invoiceForm(inv));
  });
  pages.post("/invoice/:id", (req, res) => {
    const inv = st.invoices[String(req.params.id)];
    if (!inv) return void res.status(404).send(messagePage("Not found", "This invoice does not exist."));
    if (inv.status !== "open") return void res.send(messagePage(`Invoice ${inv.number}`, `This invoice is ${inv.status}. Nothing more to pay.`));
    const card = digitsOf(String(req.body.card ?? ""));
    const problem = cardProblem(card, req.body);
    if (problem) return void res.status(402).send(invoiceForm(inv, problem));
    st.cards[inv.customer as string] = card; // paying with a card makes it the card on file
    markPaid(inv);
    emit("invoice.paid", inv);
    const sub = st.subscriptions[inv.parent?.subscription_details?.subscription as string];
    if (sub && sub.latest_invoice === inv.id && (sub.status === "past_due" || sub.status === "unpaid")) setStatus(sub, "active");
    save();
    res.send(messagePage("Paid, thank you", `Invoice ${inv.number} is paid.`));
  });
  app.use(pages);

  // --- controls for tests and the demo ---
  const ctl = express.Router();
  ctl.use((req, res, next) => (req.get("authorization") === `Bearer ${opts.apiKey}` ? next() : void res.status(401).json({ error: "api key" })));
  ctl.use(express.json());
  /** The period ends now: renew (or end a cancelled subscription). A past-due one gets its retry, and
   * after a failed retry becomes unpaid. Body { card }: the card on file changes first. */
  ctl.post("/subscriptions/:id/renew", (req, res) => {
    const sub = st.subscriptions[String(req.params.id)];
    if (!sub) return void res.status(404).json({ error: "no such subscription" });
    if (req.body?.card) st.cards[sub.customer as string] = digitsOf(String(req.body.card));
    const item = sub.items.data[0];
    if (sub.status === "past_due" || sub.status === "unpaid") {
      const inv = st.invoices[sub.latest_invoice as string];
      if (inv?.status === "open") {
        if (chargeOffSession(inv)) setStatus(sub, "active");
        else setStatus(sub, "unpaid");
      }
    } else if (sub.status === "active") {
      st.clockOffset += Math.max(item.current_period_end - now(), 0) + 1;
      if (sub.cancel_at_period_end) {
        sub.status = "canceled";
        sub.ended_at = now();
        emit("customer.subscription.deleted", sub);
      } else {
        const previous = { items: structuredClone(sub.items) };
        item.current_period_start = item.current_period_end;
        item.current_period_end = item.current_period_start + PERIOD_S;
        emit("customer.subscription.updated", sub, previous);
        const inv = newInvoice(sub, item.price.unit_amount ?? 0, "subscription_cycle", `1 × ${item.price.id}`);
        if (!chargeOffSession(inv)) setStatus(sub, "past_due");
      }
    }
    save();
    res.json(sub);
  });
  ctl.post("/webhooks/hold", (_req, res) => {
    held ??= [];
    res.json({ held: true });
  });
  ctl.post("/webhooks/release", (req, res) => {
    const out = held ?? [];
    held = null;
    for (const d of req.query.order === "reverse" ? [...out].reverse() : out) send(d);
    res.json({ released: out.length });
  });
  ctl.get("/deliveries", (_req, res) => res.json(deliveries));
  app.use("/_fake", ctl);

  const server: Server = await new Promise((resolve, reject) => {
    const s = app.listen(opts.port ?? 0, opts.host ?? "127.0.0.1", () => resolve(s));
    s.on("error", reject);
  });
  const { port } = server.address() as AddressInfo;
  const url = `http://${opts.host ?? "127.0.0.1"}:${port}`;
  publicUrl ||= url;
  return {
    url,
    setWebhookUrl: (u) => void (opts.webhookUrl = u),
    deliveries: () => deliveries,
    idle: async () => {
      let c;
      do {
        c = chain;
        await c;
      } while (c !== chain);
    },
    close: () => new Promise((r) => {
      server.closeAllConnections();
      server.close(() => r());
    }),
  };
}
