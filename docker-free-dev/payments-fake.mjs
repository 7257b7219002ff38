// Local fake of the payment provider's HTTP API, for development and tests. The app talks to it
// with the official `stripe` SDK (host/port/protocol pointed here), so it answers the same
// request and response shapes for the small subset Roundmark uses: products, prices, customers,
// checkout sessions with a hosted card page of our own (GET /pay/{sessionId}), subscriptions,
// invoices, coupons, promotion codes, events and signed webhooks; and connected accounts: an
// account per studio, an onboarding link to a page of ours (GET /connect/onboarding/{token})
// where the owner "completes" onboarding and is sent back, objects made on an account (the
// Stripe-Account header), an application fee on its subscriptions' invoices, and events that
// name the account they happened on.
//
//   node docker-free-dev/payments-fake.mjs
//   env: ROUNDMARK_PAY_PORT (12111), PAYMENTS_SECRET_KEY, PAYMENTS_WEBHOOK_SECRET,
//        PAYMENTS_WEBHOOK_URL (default $PUBLIC_BASE_URL/api/payments/webhook),
//        ROUNDMARK_PAY_DIR (.data/payments under the repo root)
//
// State lives in memory and in state.json (written after every change), so a restart keeps it.
// Test-only controls under /_control/ (same API key) move one subscription's clock forward
// (end the trial, renew, fail a payment), hold and release webhooks, and resend an event.
// Known differences from the real service: see the "Differences" comment at the end of this file.
import http from 'node:http';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const host = '127.0.0.1';
const port = Number(process.env.ROUNDMARK_PAY_PORT || 12111);
const SECRET_KEY = process.env.PAYMENTS_SECRET_KEY || 'sk_test_roundmark_local_only';
const WEBHOOK_SECRET = process.env.PAYMENTS_WEBHOOK_SECRET || 'whsec_roundmark_local_only';
const PUBLIC_URL = process.env.PAYMENTS_PUBLIC_URL || `http://${host}:${port}`;
const DEFAULT_WEBHOOK_URL =
  process.env.PAYMENTS_WEBHOOK_URL ||
  (process.env.PUBLIC_BASE_URL ? `${process.env.PUBLIC_BASE_URL.replace(/\/$/, '')}/api/payments/webhook` : null);
const dataDir = process.env.ROUNDMARK_PAY_DIR ? path.resolve(process.env.ROUNDMARK_PAY_DIR) : path.join(repoRoot, '.data', 'payments');
const stateFile = path.join(dataDir, 'state.json');
const API_VERSION = '2026-10-28.endive';
const DAY = 86400;

// Test cards: one that succeeds and one that is declined (the numbers payment providers use for tests).
const CARD_OK = '4242424242424242';
const CARD_DECLINED = '4000000000000002';

// ---------------------------------------------------------------------------------------------
// State

const COLLECTIONS = ['accounts', 'products', 'prices', 'customers', 'sessions', 'subscriptions', 'invoices', 'coupons', 'promotionCodes', 'discounts', 'events', 'webhookEndpoints'];
let state = emptyState();

function emptyState() {
  // owner: object id -> the connected account it lives on (absent: the platform's own).
  const s = { clocks: {}, internal: {}, owner: {}, links: {} };
  for (const c of COLLECTIONS) s[c] = {};
  return s;
}

function load() {
  fs.mkdirSync(dataDir, { recursive: true });
  try {
    const saved = JSON.parse(fs.readFileSync(stateFile, 'utf8'));
    state = { ...emptyState(), ...saved };
  } catch (err) {
    if (err.code !== 'ENOENT') console.error(`payments fake: could not read ${stateFile}, starting empty:`, err.message);
  }
}

function save() {
  // Keep the last 2000 events; older ones only make the file grow.
  const ids = Object.keys(state.events);
  if (ids.length > 2000) for (const id of ids.slice(0, ids.length - 2000)) delete state.events[id];
  const tmp = `${stateFile}.${process.pid}.tmp`;
  fs.writeFileSync(tmp, JSON.stringify(state));
  fs.renameSync(tmp, stateFile);
}

const PREFIX_TO_COLLECTION = {
  acct: 'accounts', prod: 'products', price: 'prices', cus: 'customers', cs: 'sessions', sub: 'subscriptions',
  in: 'invoices', promo: 'promotionCodes', di: 'discounts', evt: 'events', we: 'webhookEndpoints',
};

function newId(prefix, length = 24) {
  const alphabet = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789';
  const bytes = crypto.randomBytes(length);
  let out = '';
  for (const b of bytes) out += alphabet[b % alphabet.length];
  return `${prefix}_${out}`;
}

const realNow = () => Math.floor(Date.now() / 1000);
const clockOf = (subId) => realNow() + (state.clocks[subId] ?? 0);
const clone = (o) => JSON.parse(JSON.stringify(o));

/** The same day of the next month in UTC (the 31st becomes the month's last day), as billing does. */
function addMonth(ts) {
  const d = new Date(ts * 1000);
  const day = d.getUTCDate();
  const next = new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + 1, 1, d.getUTCHours(), d.getUTCMinutes(), d.getUTCSeconds()));
  const last = new Date(Date.UTC(next.getUTCFullYear(), next.getUTCMonth() + 1, 0)).getUTCDate();
  next.setUTCDate(Math.min(day, last));
  return Math.floor(next.getTime() / 1000);
}

// ---------------------------------------------------------------------------------------------
// Requests and answers

class ApiError extends Error {
  constructor(status, type, message, extra = {}) {
    super(message);
    this.status = status;
    this.body = { error: { type, message, ...extra } };
  }
}
const missing = (kind, id, param = 'id') =>
  new ApiError(404, 'invalid_request_error', `No such ${kind}: '${id}'`, { code: 'resource_missing', param });
const invalid = (message, param, code = 'parameter_invalid') => new ApiError(400, 'invalid_request_error', message, { code, ...(param ? { param } : {}) });
const required = (param) => new ApiError(400, 'invalid_request_error', `Missing required param: ${param}.`, { code: 'parameter_missing', param });

/** Parses form-encoded bracket notation (a[b][0][c]=v, a[]=v) into nested objects and arrays. */
function parseForm(text) {
  const root = {};
  for (const [rawKey, value] of new URLSearchParams(text)) {
    const parts = rawKey.replace(/\]/g, '').split('[');
    let node = root;
    for (let i = 0; i < parts.length; i++) {
      let key = parts[i];
      const last = i === parts.length - 1;
      if (key === '') key = String(Object.keys(node).length);
      if (last) node[key] = value;
      else node = node[key] ??= {};
    }
  }
  return arrays(root);
}
function arrays(node) {
  if (node === null || typeof node !== 'object') return node;
  const keys = Object.keys(node);
  for (const k of keys) node[k] = arrays(node[k]);
  if (keys.length && keys.every((k) => /^\d+$/.test(k))) return keys.sort((a, b) => a - b).map((k) => node[k]);
  return node;
}
const int = (v, param) => {
  if (v === undefined || v === '') return undefined;
  if (!/^-?\d+$/.test(String(v))) throw invalid(`Invalid integer: ${v}`, param);
  return Number(v);
};
const bool = (v) => (v === undefined || v === '' ? undefined : v === true || v === 'true');
const meta = (m) => (m && typeof m === 'object' ? Object.fromEntries(Object.entries(m).filter(([, v]) => v !== '')) : {});

function send(res, status, body, headers = {}) {
  const text = typeof body === 'string' ? body : JSON.stringify(body);
  res.writeHead(status, {
    'content-type': typeof body === 'string' ? 'text/html; charset=utf-8' : 'application/json',
    'request-id': newId('req', 14),
    'cache-control': 'no-store',
    ...headers,
  });
  res.end(text);
}

const list = (url, data) => ({ object: 'list', data, has_more: false, url });

/** Newest first, with `limit` and `starting_after` as the real list endpoints page. */
function page(url, items, query) {
  const sorted = items.filter(visible).reverse().sort((a, b) => (b.created ?? 0) - (a.created ?? 0));
  const limit = Math.min(int(query.limit, 'limit') ?? 10, 100);
  let start = 0;
  if (query.starting_after) start = sorted.findIndex((o) => o.id === query.starting_after) + 1;
  const data = sorted.slice(start, start + limit);
  return { ...list(url, data), has_more: start + limit < sorted.length };
}

// The account a request acts on (its Stripe-Account header), set per request before its handler
// runs; `api` is false for the hosted pages and test controls, which see every object.
const scope = { api: false, account: null };
/** The connected account an object lives on, or null for the platform's own objects. */
const ownerOf = (id) => state.owner[id] ?? null;
/** Records that an object was made on an account (the request's, unless named). */
function own(obj, account = scope.account) {
  if (account) state.owner[obj.id] = account;
  return obj;
}
const visible = (obj) => !scope.api || ownerOf(obj.id) === scope.account;

function find(collection, id, kind) {
  const obj = state[collection][id];
  // An object of another account is as unknown as one that does not exist, as the real API answers.
  if (!obj || !visible(obj)) throw missing(kind, id);
  return obj;
}

/** `expand[]=a.b` (and `data.a.b` on lists): replaces ids by their objects, one or more levels deep. */
function expand(obj, fields) {
  const out = clone(obj);
  const expandOne = (v) => {
    if (typeof v !== 'string') return v;
    const coll = PREFIX_TO_COLLECTION[v.split('_')[0]] ?? (state.coupons[v] ? 'coupons' : null);
    return coll && state[coll][v] ? clone(state[coll][v]) : v;
  };
  const walk = (node, parts) => {
    if (!node || typeof node !== 'object' || !parts.length) return;
    if (Array.isArray(node)) return node.forEach((n) => walk(n, parts));
    const [key, ...rest] = parts;
    if (Array.isArray(node[key])) node[key] = node[key].map(expandOne);
    else node[key] = expandOne(node[key]);
    walk(node[key], rest);
  };
  for (const field of fields ?? []) walk(out, String(field).split('.'));
  return out;
}

// ---------------------------------------------------------------------------------------------
// Events and signed webhooks

const holding = { on: false, events: [] };
const queues = new Map(); // url -> { busy, items: [{ eventId, attempt }] }
const deliveries = []; // recent delivery outcomes, newest last

function emit(type, object, created, previous) {
  // Events about a connected account's objects (or the account itself) name that account.
  const account = object.object === 'account' ? object.id : ownerOf(object.id);
  const event = {
    id: newId('evt'),
    object: 'event',
    ...(account ? { account } : {}),
    api_version: API_VERSION,
    created,
    data: { object: clone(object), ...(previous ? { previous_attributes: previous } : {}) },
    livemode: false,
    pending_webhooks: endpointsFor(type, account).length,
    request: { id: null, idempotency_key: null },
    type,
  };
  state.events[event.id] = own(event, account);
  if (holding.on) holding.events.push(event.id);
  else deliver(event.id);
  return event;
}

function endpointsFor(type, account = null) {
  const urls = new Set();
  for (const we of Object.values(state.webhookEndpoints)) {
    if (we.status !== 'enabled') continue;
    // A Connect endpoint hears connected accounts' events; an account endpoint the platform's own.
    if (!!we.connect !== !!account) continue;
    if (we.enabled_events.includes('*') || we.enabled_events.includes(type)) urls.add(we.url);
  }
  if (DEFAULT_WEBHOOK_URL) urls.add(DEFAULT_WEBHOOK_URL);
  return [...urls];
}

function deliver(eventId) {
  const event = state.events[eventId];
  if (!event) return;
  for (const url of endpointsFor(event.type, event.account ?? null)) {
    if (!queues.has(url)) queues.set(url, { busy: false, items: [] });
    queues.get(url).items.push({ eventId, attempt: 0 });
    pump(url);
  }
}

/** Header the SDK's constructEvent verifies: t=<unix seconds>,v1=HMAC-SHA256(secret, `${t}.${payload}`). */
function signature(payload, secret = WEBHOOK_SECRET, t = realNow()) {
  const v1 = crypto.createHmac('sha256', secret).update(`${t}.${payload}`, 'utf8').digest('hex');
  return `t=${t},v1=${v1}`;
}

// One delivery at a time per endpoint, in the order events were made; a failed one is retried
// twice (after 1 s and 4 s), then dropped.
async function pump(url) {
  const q = queues.get(url);
  if (q.busy) return;
  q.busy = true;
  while (q.items.length) {
    const item = q.items[0];
    const event = state.events[item.eventId];
    const payload = JSON.stringify(event, null, 2);
    let status = 0;
    try {
      const res = await fetch(url, {
        method: 'POST',
        headers: { 'content-type': 'application/json; charset=utf-8', 'stripe-signature': signature(payload), 'user-agent': 'roundmark-payments-fake/1.0' },
        body: payload,
        signal: AbortSignal.timeout(10_000),
      });
      status = res.status;
      await res.arrayBuffer();
    } catch {
      status = 0;
    }
    deliveries.push({ event: item.eventId, type: event?.type, url, status, attempt: item.attempt + 1, at: new Date().toISOString() });
    if (deliveries.length > 500) deliveries.shift();
    q.items.shift();
    if ((status < 200 || status >= 300) && item.attempt < 2) {
      const retry = { ...item, attempt: item.attempt + 1 };
      setTimeout(() => {
        q.items.push(retry);
        pump(url);
      }, item.attempt === 0 ? 1000 : 4000);
    }
  }
  q.busy = false;
}

// ---------------------------------------------------------------------------------------------
// Billing logic

function publicSub(sub) {
  return sub;
}

function discountFor(sub) {
  const id = sub.discounts?.[0];
  return id ? state.discounts[id] : null;
}

/**
 * Makes an invoice for a subscription and tries to charge the customer's card. A percent-off
 * coupon of duration "once" goes on the first invoice that charges something, then leaves the
 * subscription; "forever" stays.
 */
function invoiceFor(sub, { reason, start, end, charge }) {
  const price = sub.items.data[0].price;
  const customer = state.customers[sub.customer];
  const now = clockOf(sub.id);
  const subtotal = charge ? price.unit_amount : 0;
  const discount = charge ? discountFor(sub) : null;
  const coupon = discount ? state.coupons[discount.source.coupon] : null;
  const discountAmount = coupon ? Math.round((subtotal * coupon.percent_off) / 100) : 0;
  const total = subtotal - discountAmount;
  const invoice = {
    id: newId('in'),
    object: 'invoice',
    account_country: 'IE',
    account_name: 'Roundmark local payments fake',
    amount_due: total,
    amount_overpaid: 0,
    amount_paid: 0,
    amount_remaining: total,
    amount_shipping: 0,
    attempt_count: 0,
    attempted: false,
    billing_reason: reason,
    collection_method: 'charge_automatically',
    created: now,
    currency: price.currency,
    customer: sub.customer,
    customer_email: customer?.email ?? null,
    customer_name: customer?.name ?? null,
    description: null,
    discounts: discount ? [discount.id] : [],
    hosted_invoice_url: null,
    lines: list(`/v1/invoices/in/lines`, [
      {
        id: newId('il'),
        object: 'line_item',
        amount: subtotal,
        currency: price.currency,
        description: `1 × ${state.products[price.product]?.name ?? 'Membership'} (${charge ? 'monthly' : 'trial'})`,
        discount_amounts: discount ? [{ amount: discountAmount, discount: discount.id }] : [],
        discountable: true,
        livemode: false,
        metadata: {},
        period: { start, end },
        pricing: { type: 'price_details', price_details: { price: price.id, product: price.product }, unit_amount_decimal: String(charge ? price.unit_amount : 0) },
        quantity: 1,
      },
    ]),
    livemode: false,
    metadata: {},
    next_payment_attempt: null,
    number: `RM-${String(Object.keys(state.invoices).length + 1).padStart(5, '0')}`,
    parent: { type: 'subscription_details', quote_details: null, subscription_details: { subscription: sub.id, metadata: clone(sub.metadata) } },
    period_start: start,
    period_end: end,
    starting_balance: 0,
    status: 'open',
    status_transitions: { finalized_at: now, paid_at: null, voided_at: null, marked_uncollectible_at: null },
    subtotal,
    subtotal_excluding_tax: subtotal,
    total,
    total_discount_amounts: discount ? [{ amount: discountAmount, discount: discount.id }] : [],
    total_excluding_tax: total,
    total_taxes: [],
    webhooks_delivered_at: null,
  };
  invoice.lines.url = `/v1/invoices/${invoice.id}/lines`;
  // The platform's cut of a connected account's invoice: the subscription's percentage of what is charged.
  invoice.application_fee_amount = sub.application_fee_percent == null ? null : Math.round((total * sub.application_fee_percent) / 100);
  state.invoices[invoice.id] = own(invoice, ownerOf(sub.id));
  sub.latest_invoice = invoice.id;
  if (discount && coupon.duration === 'once') {
    // A once-only discount is used up by this invoice and ends on the subscription.
    discount.end = now;
    sub.discounts = [];
  }
  return invoice;
}

/** Charges an open invoice with the customer's card; answers whether it was paid. */
function attemptPayment(sub, invoice) {
  const now = clockOf(sub.id);
  const customer = state.customers[sub.customer];
  const card = state.internal[customer?.id]?.card ?? 'ok';
  invoice.attempt_count += 1;
  invoice.attempted = true;
  if (invoice.amount_due === 0 || card === 'ok') {
    invoice.status = 'paid';
    invoice.amount_paid = invoice.amount_due;
    invoice.amount_remaining = 0;
    invoice.status_transitions.paid_at = now;
    invoice.next_payment_attempt = null;
    emit('invoice.paid', invoice, now);
    return true;
  }
  invoice.next_payment_attempt = now + 3 * DAY;
  emit('invoice.payment_failed', invoice, now);
  return false;
}

function setPeriod(sub, start, end) {
  const item = sub.items.data[0];
  item.current_period_start = start;
  item.current_period_end = end;
}

function createSubscription({ customer, price, trialDays, metadata, coupon, promotionCode, checkoutSession, description, applicationFeePercent = null }) {
  const id = newId('sub');
  const now = realNow();
  const sub = {
    id,
    object: 'subscription',
    application: null,
    application_fee_percent: applicationFeePercent,
    automatic_tax: { enabled: false, liability: null, disabled_reason: null },
    billing_cycle_anchor: now,
    billing_mode: { type: 'flexible' },
    cancel_at: null,
    cancel_at_period_end: false,
    canceled_at: null,
    cancellation_details: { comment: null, feedback: null, reason: null },
    collection_method: 'charge_automatically',
    created: now,
    currency: price.currency,
    customer: customer.id,
    days_until_due: null,
    default_payment_method: state.internal[customer.id]?.paymentMethod ?? null,
    description: description ?? null,
    discounts: [],
    ended_at: null,
    items: list(`/v1/subscription_items?subscription=${id}`, [
      {
        id: newId('si', 14),
        object: 'subscription_item',
        created: now,
        current_period_start: now,
        current_period_end: now,
        discounts: [],
        metadata: {},
        price: clone(price),
        quantity: 1,
        subscription: id,
        tax_rates: [],
      },
    ]),
    latest_invoice: null,
    livemode: false,
    metadata: meta(metadata),
    pause_collection: null,
    pending_update: null,
    schedule: null,
    start_date: now,
    status: 'incomplete',
    test_clock: null,
    trial_end: null,
    trial_settings: { end_behavior: { missing_payment_method: 'create_invoice' } },
    trial_start: null,
  };
  state.subscriptions[id] = own(sub, ownerOf(customer.id));
  state.clocks[id] = 0;
  if (coupon) {
    const discount = {
      id: newId('di'),
      object: 'discount',
      checkout_session: checkoutSession ?? null,
      customer: customer.id,
      customer_account: null,
      end: null,
      invoice: null,
      invoice_item: null,
      promotion_code: promotionCode?.id ?? null,
      source: { type: 'coupon', coupon: coupon.id },
      start: now,
      subscription: id,
      subscription_item: null,
    };
    state.discounts[discount.id] = own(discount, ownerOf(customer.id));
    sub.discounts = [discount.id];
    coupon.times_redeemed += 1;
    if (promotionCode) promotionCode.times_redeemed += 1;
  }
  if (trialDays > 0) {
    sub.status = 'trialing';
    sub.trial_start = now;
    sub.trial_end = now + trialDays * DAY;
    sub.billing_cycle_anchor = sub.trial_end;
    setPeriod(sub, now, sub.trial_end);
    emit('customer.subscription.created', sub, now);
    const inv = invoiceFor(sub, { reason: 'subscription_create', start: now, end: now, charge: false });
    attemptPayment(sub, inv);
  } else {
    setPeriod(sub, now, addMonth(now));
    const inv = invoiceFor(sub, { reason: 'subscription_create', start: now, end: addMonth(now), charge: true });
    const paid = attemptPayment(sub, inv);
    sub.status = paid ? 'active' : 'incomplete';
    emit('customer.subscription.created', sub, now);
  }
  return sub;
}

function changeStatus(sub, status, now, extra = {}) {
  const previous = { status: sub.status };
  for (const k of Object.keys(extra)) previous[k] = clone(sub[k] ?? null);
  sub.status = status;
  Object.assign(sub, extra);
  emit('customer.subscription.updated', sub, now, previous);
}

/** Moves a subscription's own clock to its next billing moment and does what happens there. */
function advance(sub, action) {
  const customer = state.customers[sub.customer];
  state.internal[customer.id] ??= {};
  if (action === 'fail_payment') state.internal[customer.id].card = 'declined';
  if (action === 'pay') {
    state.internal[customer.id].card = 'ok';
    const open = Object.values(state.invoices).find((i) => i.parent?.subscription_details?.subscription === sub.id && i.status === 'open');
    if (!open) throw invalid('This subscription has no open invoice to pay.', 'subscription');
    const now = clockOf(sub.id);
    if (attemptPayment(sub, open)) changeStatus(sub, 'active', now);
    return;
  }
  if (['canceled', 'incomplete_expired'].includes(sub.status)) throw invalid(`This subscription is ${sub.status}; its clock cannot move on.`, 'subscription');
  const item = sub.items.data[0];
  const target = sub.status === 'trialing' ? sub.trial_end : item.current_period_end;
  if (action === 'end_trial' && sub.status !== 'trialing') throw invalid('This subscription is not on a trial.', 'subscription');
  state.clocks[sub.id] = Math.max(state.clocks[sub.id] ?? 0, target - realNow());
  const now = target;
  if (sub.cancel_at_period_end) {
    const previous = { status: sub.status };
    sub.status = 'canceled';
    sub.ended_at = now;
    sub.canceled_at ??= now;
    emit('customer.subscription.deleted', sub, now, previous);
    return;
  }
  const end = addMonth(now);
  const inv = invoiceFor(sub, { reason: 'subscription_cycle', start: now, end, charge: true });
  const paid = attemptPayment(sub, inv);
  const previousPeriod = { current_period_start: item.current_period_start, current_period_end: item.current_period_end };
  setPeriod(sub, now, end);
  const previous = { status: sub.status, items: { data: [previousPeriod] } };
  sub.status = paid ? 'active' : 'past_due';
  emit('customer.subscription.updated', sub, now, previous);
}

// ---------------------------------------------------------------------------------------------
// API routes

function checkPromotion(promo, now = realNow()) {
  if (!promo.active) throw invalid(`The promotion code ${promo.code} is inactive.`, 'discounts', 'promotion_code_invalid');
  if (promo.expires_at && promo.expires_at <= now) throw invalid(`The promotion code ${promo.code} has expired.`, 'discounts', 'promotion_code_invalid');
  if (promo.max_redemptions && promo.times_redeemed >= promo.max_redemptions)
    throw invalid(`The promotion code ${promo.code} has been fully redeemed.`, 'discounts', 'promotion_code_invalid');
  checkCoupon(state.coupons[promo.promotion.coupon]);
}
function checkCoupon(coupon) {
  if (!coupon || !coupon.valid) throw invalid('This coupon is no longer valid.', 'discounts', 'coupon_expired');
  if (coupon.redeem_by && coupon.redeem_by <= realNow()) throw invalid(`The coupon ${coupon.id} has expired.`, 'discounts', 'coupon_expired');
}

const routes = [];
const route = (method, pattern, handler) => routes.push({ method, re: new RegExp(`^${pattern}$`), handler });

route('POST', '/v1/products', (p) => {
  if (!p.name) throw required('name');
  const now = realNow();
  const product = { id: p.id || newId('prod', 14), object: 'product', active: bool(p.active) ?? true, created: now, default_price: null, description: p.description ?? null, images: [], livemode: false, marketing_features: [], metadata: meta(p.metadata), name: p.name, package_dimensions: null, shippable: null, statement_descriptor: null, tax_code: null, type: 'service', unit_label: null, updated: now, url: null };
  if (state.products[product.id]) throw invalid(`Product already exists.`, 'id', 'resource_already_exists');
  return (state.products[product.id] = own(product));
});
route('GET', '/v1/products/([^/]+)', (p, q, [id]) => find('products', id, 'product'));
route('POST', '/v1/products/([^/]+)', (p, q, [id]) => {
  const product = find('products', id, 'product');
  if (p.name) product.name = p.name;
  if (p.active !== undefined) product.active = bool(p.active);
  if (p.metadata) product.metadata = { ...product.metadata, ...meta(p.metadata) };
  product.updated = realNow();
  return product;
});

route('POST', '/v1/prices', (p) => {
  if (!p.currency) throw required('currency');
  const unit = int(p.unit_amount, 'unit_amount');
  if (unit === undefined) throw required('unit_amount');
  if (unit < 0) throw invalid('unit_amount must be 0 or more.', 'unit_amount');
  if (!p.product) throw required('product');
  find('products', p.product, 'product');
  if (p.recurring && p.recurring.interval !== 'month') throw invalid('The local payments fake supports monthly prices only.', 'recurring[interval]');
  const price = {
    id: newId('price'), object: 'price', active: bool(p.active) ?? true, billing_scheme: 'per_unit', created: realNow(), currency: String(p.currency).toLowerCase(),
    custom_unit_amount: null, livemode: false, lookup_key: p.lookup_key ?? null, metadata: meta(p.metadata), nickname: p.nickname ?? null, product: p.product,
    recurring: p.recurring ? { interval: 'month', interval_count: 1, meter: null, trial_period_days: null, usage_type: 'licensed' } : null,
    tax_behavior: 'unspecified', tiers_mode: null, transform_quantity: null, type: p.recurring ? 'recurring' : 'one_time', unit_amount: unit, unit_amount_decimal: String(unit),
  };
  return (state.prices[price.id] = own(price));
});
route('GET', '/v1/prices/([^/]+)', (p, q, [id]) => find('prices', id, 'price'));
route('POST', '/v1/prices/([^/]+)', (p, q, [id]) => {
  const price = find('prices', id, 'price');
  if (p.active !== undefined) price.active = bool(p.active);
  if (p.nickname !== undefined) price.nickname = p.nickname || null;
  if (p.metadata) price.metadata = { ...price.metadata, ...meta(p.metadata) };
  return price;
});

route('POST', '/v1/customers', (p) => {
  const customer = { id: newId('cus', 14), object: 'customer', address: null, balance: 0, created: realNow(), currency: null, default_source: null, delinquent: false, description: p.description ?? null, email: p.email ?? null, invoice_prefix: 'RM', invoice_settings: { custom_fields: null, default_payment_method: null, footer: null, rendering_options: null }, livemode: false, metadata: meta(p.metadata), name: p.name ?? null, phone: null, preferred_locales: [], shipping: null, tax_exempt: 'none', test_clock: null };
  return (state.customers[customer.id] = own(customer));
});
route('GET', '/v1/customers/([^/]+)', (p, q, [id]) => find('customers', id, 'customer'));
route('POST', '/v1/customers/([^/]+)', (p, q, [id]) => {
  const c = find('customers', id, 'customer');
  if (p.email !== undefined) c.email = p.email || null;
  if (p.name !== undefined) c.name = p.name || null;
  if (p.metadata) c.metadata = { ...c.metadata, ...meta(p.metadata) };
  return c;
});
route('GET', '/v1/customers', (p, q) => page('/v1/customers', Object.values(state.customers).filter((c) => !q.email || c.email === q.email), q));

route('POST', '/v1/coupons', (p) => {
  const percent = p.percent_off === undefined ? undefined : Number(p.percent_off);
  if (p.amount_off !== undefined) throw invalid('The local payments fake supports percent_off coupons only.', 'amount_off');
  if (percent === undefined) throw invalid('You must pass either amount_off or percent_off.', 'percent_off', 'parameter_missing');
  if (!(percent > 0 && percent <= 100)) throw invalid('percent_off must be more than 0 and at most 100.', 'percent_off');
  const duration = p.duration ?? 'once';
  if (!['once', 'forever'].includes(duration)) throw invalid('The local payments fake supports duration once or forever only.', 'duration');
  const id = p.id || crypto.randomBytes(6).toString('base64url');
  if (state.coupons[id]) throw invalid('Coupon already exists.', 'id', 'resource_already_exists');
  const coupon = { id, object: 'coupon', amount_off: null, created: realNow(), currency: null, duration, duration_in_months: null, livemode: false, max_redemptions: int(p.max_redemptions, 'max_redemptions') ?? null, metadata: meta(p.metadata), name: p.name ?? null, percent_off: percent, redeem_by: int(p.redeem_by, 'redeem_by') ?? null, times_redeemed: 0, valid: true };
  return (state.coupons[id] = own(coupon));
});
route('GET', '/v1/coupons/([^/]+)', (p, q, [id]) => find('coupons', id, 'coupon'));
route('DELETE', '/v1/coupons/([^/]+)', (p, q, [id]) => {
  find('coupons', id, 'coupon').valid = false;
  return { id, object: 'coupon', deleted: true };
});

route('POST', '/v1/promotion_codes', (p) => {
  const couponId = p.promotion?.coupon ?? p.coupon;
  if (!couponId) throw required('promotion[coupon]');
  checkCoupon(find('coupons', couponId, 'coupon'));
  const code = p.code || crypto.randomBytes(5).toString('hex').toUpperCase();
  if (!/^[a-zA-Z0-9_-]{1,500}$/.test(code)) throw invalid('A promotion code may hold only letters, digits, - and _.', 'code');
  const active = bool(p.active) ?? true;
  // Codes are unique among one account's active codes; another account may use the same code.
  if (active && Object.values(state.promotionCodes).some((pc) => visible(pc) && pc.active && pc.code.toLowerCase() === code.toLowerCase()))
    throw invalid(`An active promotion code with \`code: ${code}\` already exists.`, 'code', 'resource_already_exists');
  const promo = { id: newId('promo', 14), object: 'promotion_code', active, code, created: realNow(), customer: null, customer_account: null, expires_at: int(p.expires_at, 'expires_at') ?? null, livemode: false, max_redemptions: int(p.max_redemptions, 'max_redemptions') ?? null, metadata: meta(p.metadata), promotion: { type: 'coupon', coupon: couponId }, restrictions: { currency_options: {}, first_time_transaction: false, minimum_amount: null, minimum_amount_currency: null }, times_redeemed: 0 };
  return (state.promotionCodes[promo.id] = own(promo));
});
route('GET', '/v1/promotion_codes/([^/]+)', (p, q, [id]) => find('promotionCodes', id, 'promotion code'));
route('POST', '/v1/promotion_codes/([^/]+)', (p, q, [id]) => {
  const promo = find('promotionCodes', id, 'promotion code');
  if (p.active !== undefined) promo.active = bool(p.active);
  if (p.metadata) promo.metadata = { ...promo.metadata, ...meta(p.metadata) };
  return promo;
});
route('GET', '/v1/promotion_codes', (p, q) =>
  page(
    '/v1/promotion_codes',
    Object.values(state.promotionCodes).filter(
      (pc) =>
        (!q.code || pc.code.toLowerCase() === String(q.code).toLowerCase()) &&
        (q.active === undefined || pc.active === bool(q.active)) &&
        (!q.coupon || pc.promotion.coupon === q.coupon),
    ),
    q,
  ),
);

route('POST', '/v1/checkout/sessions', (p) => {
  if (p.mode !== 'subscription') throw invalid('The local payments fake supports mode=subscription only.', 'mode');
  if (!p.success_url) throw required('success_url');
  const items = p.line_items ?? [];
  if (items.length !== 1) throw invalid('Pass exactly one line item with a recurring price.', 'line_items');
  const price = find('prices', items[0].price, 'price');
  if (!price.active) throw invalid(`The price specified is inactive. This field only accepts active prices.`, 'line_items[0][price]');
  if (!price.recurring) throw invalid('A subscription needs a recurring price.', 'line_items[0][price]');
  if (p.customer) find('customers', p.customer, 'customer');
  const discounts = p.discounts ?? [];
  if (discounts.length && bool(p.allow_promotion_codes)) throw invalid('You may only specify one of these parameters: allow_promotion_codes, discounts.', 'discounts');
  if (discounts.length > 1) throw invalid('Only one discount may be applied.', 'discounts');
  const d = discounts[0];
  let coupon = null;
  let promo = null;
  if (d?.promotion_code) {
    promo = find('promotionCodes', d.promotion_code, 'promotion code');
    checkPromotion(promo);
    coupon = state.coupons[promo.promotion.coupon];
  } else if (d?.coupon) {
    coupon = find('coupons', d.coupon, 'coupon');
    checkCoupon(coupon);
  }
  const trialDays = int(p.subscription_data?.trial_period_days, 'subscription_data[trial_period_days]') ?? 0;
  if (trialDays < 0 || trialDays > 730) throw invalid('trial_period_days must be between 1 and 730.', 'subscription_data[trial_period_days]');
  const applicationFeePercent = feePercent(p.subscription_data?.application_fee_percent, 'subscription_data[application_fee_percent]');
  if (scope.account) chargeable(state.accounts[scope.account]);
  const now = realNow();
  const discountAmount = coupon ? Math.round((price.unit_amount * coupon.percent_off) / 100) : 0;
  const id = newId('cs_test', 58);
  const session = {
    id, object: 'checkout.session', allow_promotion_codes: bool(p.allow_promotion_codes) ?? null,
    amount_subtotal: trialDays ? 0 : price.unit_amount, amount_total: trialDays ? 0 : price.unit_amount - discountAmount,
    billing_address_collection: null, cancel_url: p.cancel_url ?? null, client_reference_id: p.client_reference_id ?? null,
    created: now, currency: price.currency, customer: p.customer ?? null, customer_creation: p.customer ? null : 'always',
    customer_details: null, customer_email: p.customer_email ?? null,
    discounts: promo ? [{ coupon: null, promotion_code: promo.id }] : coupon ? [{ coupon: coupon.id, promotion_code: null }] : [],
    expires_at: now + DAY, invoice: null, livemode: false, locale: p.locale ?? null, metadata: meta(p.metadata), mode: 'subscription',
    payment_method_types: ['card'], payment_status: 'unpaid', status: 'open', submit_type: null, subscription: null,
    success_url: p.success_url, total_details: { amount_discount: trialDays ? 0 : discountAmount, amount_shipping: 0, amount_tax: 0 },
    ui_mode: 'hosted', url: `${PUBLIC_URL}/pay/${id}`,
  };
  state.sessions[id] = own(session);
  state.internal[id] = { price: price.id, trialDays, subscriptionData: { metadata: meta(p.subscription_data?.metadata), description: p.subscription_data?.description ?? null, applicationFeePercent }, attempts: [] };
  return session;
});
route('GET', '/v1/checkout/sessions/([^/]+)', (p, q, [id]) => find('sessions', id, 'checkout session'));
route('GET', '/v1/checkout/sessions', (p, q) =>
  page('/v1/checkout/sessions', Object.values(state.sessions).filter((s) => (!q.customer || s.customer === q.customer) && (!q.subscription || s.subscription === q.subscription)), q),
);
route('POST', '/v1/checkout/sessions/([^/]+)/expire', (p, q, [id]) => {
  const s = find('sessions', id, 'checkout session');
  if (s.status !== 'open') throw invalid(`Only open sessions can be expired; this one is ${s.status}.`, 'session');
  s.status = 'expired';
  s.url = null;
  emit('checkout.session.expired', s, realNow());
  return s;
});

route('POST', '/v1/subscriptions', (p) => {
  if (!p.customer) throw required('customer');
  const customer = find('customers', p.customer, 'customer');
  const priceId = p.items?.[0]?.price;
  if (!priceId) throw required('items[0][price]');
  const price = find('prices', priceId, 'price');
  if (!price.recurring) throw invalid('A subscription needs a recurring price.', 'items[0][price]');
  let coupon = null;
  let promo = null;
  const d = (p.discounts ?? [])[0];
  if (d?.promotion_code) {
    promo = find('promotionCodes', d.promotion_code, 'promotion code');
    checkPromotion(promo);
    coupon = state.coupons[promo.promotion.coupon];
  } else if (d?.coupon) coupon = find('coupons', d.coupon, 'coupon');
  // Created through the API, the customer is taken to have the succeeding test card on file.
  state.internal[customer.id] ??= { card: 'ok' };
  const applicationFeePercent = feePercent(p.application_fee_percent, 'application_fee_percent');
  if (scope.account) chargeable(state.accounts[scope.account]);
  return createSubscription({ customer, price, trialDays: int(p.trial_period_days, 'trial_period_days') ?? 0, metadata: p.metadata, coupon, promotionCode: promo, description: p.description, applicationFeePercent });
});
route('GET', '/v1/subscriptions/([^/]+)', (p, q, [id]) => publicSub(find('subscriptions', id, 'subscription')));
route('POST', '/v1/subscriptions/([^/]+)', (p, q, [id]) => {
  const sub = find('subscriptions', id, 'subscription');
  if (sub.status === 'canceled') throw invalid('A canceled subscription can only update its cancellation_details and metadata.', 'cancel_at_period_end');
  const previous = {};
  if (p.cancel_at_period_end !== undefined) {
    const v = bool(p.cancel_at_period_end);
    if (v !== sub.cancel_at_period_end) {
      Object.assign(previous, { cancel_at_period_end: sub.cancel_at_period_end, cancel_at: sub.cancel_at, canceled_at: sub.canceled_at });
      const now = clockOf(sub.id);
      sub.cancel_at_period_end = v;
      sub.cancel_at = v ? (sub.status === 'trialing' ? sub.trial_end : sub.items.data[0].current_period_end) : null;
      sub.canceled_at = v ? now : null;
    }
  }
  if (p.metadata) {
    previous.metadata = clone(sub.metadata);
    sub.metadata = { ...sub.metadata, ...meta(p.metadata) };
  }
  if (Object.keys(previous).length) emit('customer.subscription.updated', sub, clockOf(sub.id), previous);
  return sub;
});
route('DELETE', '/v1/subscriptions/([^/]+)', (p, q, [id]) => {
  const sub = find('subscriptions', id, 'subscription');
  if (sub.status === 'canceled') throw invalid(`No such subscription: '${id}'; it is already canceled.`, 'id', 'resource_missing');
  const now = clockOf(sub.id);
  const previous = { status: sub.status };
  sub.status = 'canceled';
  sub.canceled_at = now;
  sub.ended_at = now;
  emit('customer.subscription.deleted', sub, now, previous);
  return sub;
});
route('GET', '/v1/subscriptions', (p, q) => {
  const status = q.status ?? 'not-canceled';
  return page(
    '/v1/subscriptions',
    Object.values(state.subscriptions).filter(
      (s) =>
        (!q.customer || s.customer === q.customer) &&
        (!q.price || s.items.data[0].price.id === q.price) &&
        (status === 'all' || (status === 'not-canceled' ? !['canceled', 'incomplete_expired'].includes(s.status) : s.status === status)),
    ),
    q,
  );
});

route('GET', '/v1/invoices/([^/]+)', (p, q, [id]) => find('invoices', id, 'invoice'));
route('GET', '/v1/invoices', (p, q) =>
  page(
    '/v1/invoices',
    Object.values(state.invoices).filter(
      (i) => (!q.customer || i.customer === q.customer) && (!q.subscription || i.parent?.subscription_details?.subscription === q.subscription) && (!q.status || i.status === q.status),
    ),
    q,
  ),
);

route('GET', '/v1/events/([^/]+)', (p, q, [id]) => find('events', id, 'event'));
route('GET', '/v1/events', (p, q) => page('/v1/events', Object.values(state.events).filter((e) => !q.type || e.type === q.type), q));

route('POST', '/v1/webhook_endpoints', (p) => {
  if (!p.url) throw required('url');
  if (!Array.isArray(p.enabled_events) || !p.enabled_events.length) throw required('enabled_events');
  const we = { id: newId('we', 14), object: 'webhook_endpoint', api_version: p.api_version ?? null, application: null, connect: bool(p.connect) ?? false, created: realNow(), description: p.description ?? null, enabled_events: p.enabled_events, livemode: false, metadata: meta(p.metadata), secret: WEBHOOK_SECRET, status: 'enabled', url: p.url };
  return (state.webhookEndpoints[we.id] = we);
});
route('GET', '/v1/webhook_endpoints', (p, q) => page('/v1/webhook_endpoints', Object.values(state.webhookEndpoints).map(({ secret, ...we }) => we), q));
route('GET', '/v1/webhook_endpoints/([^/]+)', (p, q, [id]) => {
  const { secret, ...we } = find('webhookEndpoints', id, 'webhook endpoint');
  return we;
});
route('DELETE', '/v1/webhook_endpoints/([^/]+)', (p, q, [id]) => {
  find('webhookEndpoints', id, 'webhook endpoint');
  delete state.webhookEndpoints[id];
  return { id, object: 'webhook_endpoint', deleted: true };
});

// ---------------------------------------------------------------------------------------------
// Connected accounts

/** An application fee percentage: only on a connected account's objects, 0–100 with 2 decimals. */
function feePercent(value, param) {
  if (value === undefined || value === '') return null;
  if (!scope.account) throw invalid('An application fee can only be set on a connected account (send the Stripe-Account header).', param);
  const n = Number(value);
  if (!Number.isFinite(n) || n < 0 || n > 100 || Math.round(n * 100) !== n * 100) throw invalid(`${param} must be a number from 0 to 100 with at most two decimals.`, param);
  return n;
}

/** Refuses to sell on an account that has not finished onboarding, as the real API does. */
function chargeable(account) {
  if (!account?.charges_enabled) {
    throw invalid(`The account ${account?.id ?? scope.account} cannot currently make charges: its onboarding is not complete.`, 'account', 'account_invalid');
  }
}

const NEEDED_AT_ONBOARDING = ['business_profile.name', 'external_account', 'tos_acceptance.date'];

function newAccount(p) {
  const now = realNow();
  const type = p.type ?? (p.controller ? (p.controller.stripe_dashboard?.type === 'express' ? 'express' : 'standard') : 'standard');
  if (!['standard', 'express', 'custom'].includes(type)) throw invalid('type must be standard, express or custom.', 'type');
  const country = String(p.country ?? 'IE').toUpperCase();
  if (!/^[A-Z]{2}$/.test(country)) throw invalid('country must be a two-letter ISO 3166-1 code.', 'country');
  return {
    id: newId('acct', 16),
    object: 'account',
    business_profile: { name: p.business_profile?.name ?? null, url: p.business_profile?.url ?? null, mcc: null, product_description: null, support_email: null },
    business_type: p.business_type ?? null,
    capabilities: { card_payments: 'inactive', transfers: 'inactive' },
    charges_enabled: false,
    controller: { type: 'application', is_controller: true, fees: { payer: p.controller?.fees?.payer ?? 'account' }, losses: { payments: p.controller?.losses?.payments ?? 'stripe' }, stripe_dashboard: { type: p.controller?.stripe_dashboard?.type ?? (type === 'express' ? 'express' : 'full') }, requirement_collection: 'stripe' },
    country,
    created: now,
    default_currency: String(p.default_currency ?? 'eur').toLowerCase(),
    details_submitted: false,
    email: p.email ?? null,
    external_accounts: list('/v1/accounts/external_accounts', []),
    metadata: meta(p.metadata),
    payouts_enabled: false,
    requirements: { alternatives: [], current_deadline: null, currently_due: [...NEEDED_AT_ONBOARDING], disabled_reason: 'requirements.past_due', errors: [], eventually_due: [...NEEDED_AT_ONBOARDING], past_due: [...NEEDED_AT_ONBOARDING], pending_verification: [] },
    settings: { payouts: { schedule: { interval: 'daily', delay_days: 7 } } },
    tos_acceptance: { date: null },
    type,
  };
}

/**
 * Moves an account to an onboarding outcome and announces it (account.updated, naming the
 * account): complete (charges and payouts on), incomplete (details not submitted yet),
 * restricted (details submitted but something still due, so neither charges nor payouts).
 */
function setOnboarding(account, outcome, details = {}) {
  const previous = { charges_enabled: account.charges_enabled, payouts_enabled: account.payouts_enabled, details_submitted: account.details_submitted, requirements: clone(account.requirements) };
  const done = outcome === 'complete';
  if (details.businessName) account.business_profile.name = details.businessName;
  if (details.iban) account.external_accounts = list(`/v1/accounts/${account.id}/external_accounts`, [{ id: newId('ba', 14), object: 'bank_account', account: account.id, country: details.iban.slice(0, 2), currency: account.default_currency, last4: details.iban.slice(-4), status: 'new' }]);
  account.details_submitted = outcome !== 'incomplete';
  account.charges_enabled = done;
  account.payouts_enabled = done;
  account.capabilities = { card_payments: done ? 'active' : outcome === 'restricted' ? 'pending' : 'inactive', transfers: done ? 'active' : outcome === 'restricted' ? 'pending' : 'inactive' };
  const due = done ? [] : outcome === 'restricted' ? ['external_account'] : [...NEEDED_AT_ONBOARDING];
  account.requirements = { ...account.requirements, currently_due: due, eventually_due: due, past_due: due, disabled_reason: done ? null : 'requirements.past_due' };
  if (account.details_submitted && !account.tos_acceptance.date) account.tos_acceptance.date = realNow();
  emit('account.updated', account, realNow(), previous);
}

route('POST', '/v1/accounts', (p) => {
  if (scope.account) throw new ApiError(403, 'invalid_request_error', 'A connected account cannot create accounts.', { code: 'platform_api_key_expired' });
  const account = newAccount(p);
  return (state.accounts[account.id] = account);
});
route('GET', '/v1/accounts/([^/]+)', (p, q, [id]) => {
  const account = state.accounts[id];
  // The platform reads its accounts; an account reads only itself.
  if (!account || (scope.account && scope.account !== id)) throw missing('account', id, 'account');
  return account;
});
route('GET', '/v1/account', () => {
  if (!scope.account) return { id: 'acct_platform', object: 'account', business_profile: { name: 'Roundmark local payments fake' }, charges_enabled: true, payouts_enabled: true, details_submitted: true, country: 'IE', default_currency: 'eur', metadata: {} };
  return state.accounts[scope.account];
});
route('POST', '/v1/accounts/([^/]+)', (p, q, [id]) => {
  const account = state.accounts[id];
  if (!account || (scope.account && scope.account !== id)) throw missing('account', id, 'account');
  if (p.metadata) account.metadata = { ...account.metadata, ...meta(p.metadata) };
  if (p.email !== undefined) account.email = p.email || null;
  if (p.business_profile?.name !== undefined) account.business_profile.name = p.business_profile.name || null;
  return account;
});
route('GET', '/v1/accounts', (p, q) => {
  if (scope.account) throw new ApiError(403, 'invalid_request_error', 'A connected account cannot list accounts.');
  return page('/v1/accounts', Object.values(state.accounts), q);
});

route('POST', '/v1/account_links', (p) => {
  if (scope.account) throw new ApiError(403, 'invalid_request_error', 'Account links are made by the platform.');
  if (!p.account) throw required('account');
  if (!state.accounts[p.account]) throw missing('account', p.account, 'account');
  if (!['account_onboarding', 'account_update'].includes(p.type)) throw invalid('type must be account_onboarding or account_update.', 'type');
  for (const param of ['refresh_url', 'return_url']) {
    if (!p[param]) throw required(param);
    if (!/^https?:\/\//.test(p[param])) throw invalid(`${param} must be an http(s) URL.`, param, 'url_invalid');
  }
  const token = crypto.randomBytes(18).toString('base64url');
  const created = realNow();
  // Links are single-use and short-lived; an expired or used one sends the person to refresh_url.
  state.links[token] = { account: p.account, refreshUrl: p.refresh_url, returnUrl: p.return_url, expiresAt: created + 300, used: false };
  return { object: 'account_link', created, expires_at: created + 300, url: `${PUBLIC_URL}/connect/onboarding/${token}` };
});

// Test-only: which connected account an object lives on (null: the platform's own).
route('GET', '/_control/objects/([^/]+)/account', (p, q, [id]) => ({ id, account: ownerOf(id) }));

// Test-only: an onboarding outcome without the page (demo data, integration tests).
route('POST', '/_control/accounts/([^/]+)/onboarding', (p, q, [id]) => {
  const account = state.accounts[id];
  if (!account) throw missing('account', id, 'account');
  if (!['complete', 'incomplete', 'restricted'].includes(p.outcome)) throw invalid('outcome must be complete, incomplete or restricted.', 'outcome');
  setOnboarding(account, p.outcome);
  return account;
});

// Test-only controls (JSON or form bodies, same API key).
route('POST', '/_control/advance', (p) => {
  const sub = find('subscriptions', p.subscription, 'subscription');
  const action = p.action;
  if (!['end_trial', 'renew', 'fail_payment', 'pay'].includes(action)) throw invalid('action must be end_trial, renew, fail_payment or pay.', 'action');
  advance(sub, action);
  return { subscription: sub, clock: clockOf(sub.id) };
});
route('POST', '/_control/webhooks', (p) => {
  if (p.hold !== undefined) holding.on = bool(p.hold);
  if (!holding.on && holding.events.length) {
    const ids = p.order === 'reverse' ? [...holding.events].reverse() : holding.events;
    holding.events = [];
    for (const id of ids) deliver(id);
  }
  return { hold: holding.on, held: holding.events };
});
route('POST', '/_control/events/([^/]+)/resend', (p, q, [id]) => {
  find('events', id, 'event');
  deliver(id);
  return { resent: id };
});
route('GET', '/_control/deliveries', (p, q) => ({ deliveries: deliveries.filter((d) => !q.event || d.event === q.event) }));

// ---------------------------------------------------------------------------------------------
// The hosted card page (our own, deliberately plain)

const esc = (s) => String(s ?? '').replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]);
const money = (minor, currency) => new Intl.NumberFormat('en-IE', { style: 'currency', currency: currency.toUpperCase() }).format(minor / 100);

function luhn(digits) {
  let sum = 0;
  for (let i = 0; i < digits.length; i++) {
    let d = Number(digits[digits.length - 1 - i]);
    if (i % 2 === 1) {
      d *= 2;
      if (d > 9) d -= 9;
    }
    sum += d;
  }
  return digits.length >= 12 && sum % 10 === 0;
}

function payPage(session, { error = '', values = {} } = {}) {
  const info = state.internal[session.id];
  const price = state.prices[info.price];
  const product = state.products[price.product];
  const d = session.discounts[0];
  const promo = d?.promotion_code ? state.promotionCodes[d.promotion_code] : null;
  const coupon = promo ? state.coupons[promo.promotion.coupon] : d?.coupon ? state.coupons[d.coupon] : null;
  const monthly = money(price.unit_amount, price.currency);
  const first = coupon ? money(price.unit_amount - Math.round((price.unit_amount * coupon.percent_off) / 100), price.currency) : monthly;
  const email = values.email ?? session.customer_email ?? (session.customer ? state.customers[session.customer]?.email : '') ?? '';
  const lines = [
    info.trialDays ? `<li>Free for ${info.trialDays} days, then ${monthly} a month.</li>` : `<li>${monthly} a month.</li>`,
    coupon ? `<li>Code ${esc(promo?.code ?? coupon.name ?? coupon.id)}: ${coupon.percent_off}% off the first ${coupon.duration === 'once' ? 'payment' : 'payments'} (${first}${info.trialDays ? ' after the free days' : ' today'}).</li>` : '',
    `<li>${info.trialDays ? `Nothing is charged today.` : `${first} is charged today.`}</li>`,
  ].join('');
  let body;
  if (session.status === 'complete') body = `<p>This payment is already done.</p><p><a href="${esc(session.success_url)}">Go back to the site</a></p>`;
  else if (session.status === 'expired' || session.expires_at <= realNow()) body = `<p>This payment page has expired. Go back to the site and start again.</p>${session.cancel_url ? `<p><a href="${esc(session.cancel_url)}">Go back</a></p>` : ''}`;
  else
    body = `
    <ul class="sum">${lines}</ul>
    ${error ? `<p class="err" role="alert">${esc(error)}</p>` : ''}
    <form method="post" novalidate>
      <label>E-mail <input name="email" type="email" autocomplete="email" value="${esc(email)}" required></label>
      <label>Card number <input name="card" inputmode="numeric" autocomplete="cc-number" placeholder="1234 1234 1234 1234" value="${esc(values.card ?? '')}" required></label>
      <div class="row">
        <label>Expiry (MM/YY) <input name="expiry" autocomplete="cc-exp" placeholder="MM/YY" value="${esc(values.expiry ?? '')}" required></label>
        <label>Security code <input name="cvc" inputmode="numeric" autocomplete="cc-csc" placeholder="123" value="${esc(values.cvc ?? '')}" required></label>
      </div>
      <label>Name on card <input name="name" autocomplete="cc-name" value="${esc(values.name ?? '')}"></label>
      <button type="submit">${info.trialDays ? 'Start free trial' : `Pay ${first}`}</button>
    </form>
    ${session.cancel_url ? `<p><a href="${esc(session.cancel_url)}">Cancel and go back</a></p>` : ''}
    <p class="note">Local test payments: nothing is charged. Card 4242 4242 4242 4242 goes through; 4000 0000 0000 0002 is declined. Any future expiry and any 3 digits work.</p>`;
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Payment · ${esc(product?.name ?? 'Membership')}</title>
<style>
body{font:16px/1.5 system-ui,sans-serif;margin:0;background:#eee;color:#222}
main{max-width:26rem;margin:2rem auto;background:#fff;border:1px solid #ccc;padding:1.5rem}
h1{font-size:1.25rem;margin:0 0 .25rem}.sub{color:#555;margin:0 0 1rem}
label{display:block;margin:.75rem 0 0;font-weight:600}input{display:block;width:100%;box-sizing:border-box;padding:.5rem;border:1px solid #888;font:inherit;font-weight:400}
.row{display:flex;gap:1rem}.row label{flex:1}button{margin-top:1rem;width:100%;padding:.6rem;font:inherit;font-weight:700;background:#333;color:#fff;border:0;cursor:pointer}
.err{background:#fdecea;border:1px solid #a33;color:#8a1c1c;padding:.5rem}.note{font-size:.85rem;color:#555}.sum{padding-left:1.2rem}
:focus-visible{outline:3px solid #36c;outline-offset:2px}
</style></head><body><main>
<p class="sub">Test payment page · local only</p>
<h1>${esc(product?.name ?? 'Membership')}</h1>
${body}
</main></body></html>`;
}

function payPost(session, form) {
  const values = { email: form.email ?? '', card: form.card ?? '', expiry: form.expiry ?? '', cvc: form.cvc ?? '', name: form.name ?? '' };
  const info = state.internal[session.id];
  if (session.status !== 'open' || session.expires_at <= realNow()) return { status: 410, html: payPage(session) };
  const digits = values.card.replace(/[\s-]/g, '');
  const fail = (error, status = 400) => {
    info.attempts.push({ at: realNow(), outcome: error });
    return { status, html: payPage(session, { error, values }) };
  };
  if (!/^[^@\s]+@[^@\s]+\.[^@\s]+$/.test(values.email)) return fail('Enter the e-mail address for the receipt.');
  if (!digits) return fail('Enter a card number.');
  if (!/^\d+$/.test(digits) || !luhn(digits)) return fail('That card number is not valid. Check the digits and try again.');
  const exp = /^(\d{1,2})\s*\/\s*(\d{2})$/.exec(values.expiry.trim());
  if (!exp || Number(exp[1]) < 1 || Number(exp[1]) > 12) return fail('Enter the expiry date as MM/YY.');
  const expEnd = Date.UTC(2000 + Number(exp[2]), Number(exp[1]), 1);
  if (expEnd <= Date.now()) return fail('This card has expired. Use another card.');
  if (!/^\d{3,4}$/.test(values.cvc.trim())) return fail('Enter the 3 or 4 digit security code.');
  if (digits === CARD_DECLINED) return fail('Your card was declined. Nothing was charged. Try another card.', 402);
  if (digits !== CARD_OK) return fail('Only test cards work here. Use 4242 4242 4242 4242.', 402);

  let customer = session.customer ? state.customers[session.customer] : null;
  if (!customer) {
    customer = { id: newId('cus', 14), object: 'customer', address: null, balance: 0, created: realNow(), currency: null, default_source: null, delinquent: false, description: null, email: values.email, invoice_prefix: 'RM', invoice_settings: { custom_fields: null, default_payment_method: null, footer: null, rendering_options: null }, livemode: false, metadata: {}, name: values.name || null, phone: null, preferred_locales: [], shipping: null, tax_exempt: 'none', test_clock: null };
    state.customers[customer.id] = own(customer, ownerOf(session.id));
    emit('customer.created', customer, realNow());
  }
  const pm = newId('pm', 14);
  state.internal[customer.id] = { ...(state.internal[customer.id] ?? {}), card: 'ok', paymentMethod: pm, last4: digits.slice(-4) };
  customer.invoice_settings.default_payment_method = pm;
  const price = state.prices[info.price];
  const d = session.discounts[0];
  const promo = d?.promotion_code ? state.promotionCodes[d.promotion_code] : null;
  const coupon = promo ? state.coupons[promo.promotion.coupon] : d?.coupon ? state.coupons[d.coupon] : null;
  try {
    if (promo) checkPromotion(promo);
  } catch (err) {
    return fail(`${err.message} Go back to the site and start again without it.`);
  }
  const sub = createSubscription({ customer, price, trialDays: info.trialDays, metadata: info.subscriptionData.metadata, description: info.subscriptionData.description, coupon, promotionCode: promo, checkoutSession: session.id, applicationFeePercent: info.subscriptionData.applicationFeePercent });
  Object.assign(session, {
    status: 'complete',
    payment_status: info.trialDays ? 'no_payment_required' : 'paid',
    customer: customer.id,
    customer_details: { address: null, email: values.email, name: values.name || null, phone: null, tax_exempt: 'none', tax_ids: [] },
    subscription: sub.id,
    invoice: sub.latest_invoice,
    url: null,
  });
  emit('checkout.session.completed', session, realNow());
  return { redirect: session.success_url.replace('{CHECKOUT_SESSION_ID}', session.id) };
}

// ---------------------------------------------------------------------------------------------
// The hosted onboarding page for connected accounts (ours, deliberately plain)

/** IBAN check digits: ISO 13616-1 (move the first four characters to the end, letters A=10…Z=35, mod 97 = 1). */
function ibanValid(raw) {
  const iban = raw.replace(/\s+/g, '').toUpperCase();
  if (!/^[A-Z]{2}\d{2}[A-Z0-9]{11,30}$/.test(iban)) return false;
  const digits = (iban.slice(4) + iban.slice(0, 4)).replace(/[A-Z]/g, (c) => String(c.charCodeAt(0) - 55));
  let rest = 0;
  for (const d of digits) rest = (rest * 10 + Number(d)) % 97;
  return rest === 1;
}

const PAGE_STYLE = `body{font:16px/1.5 system-ui,sans-serif;margin:0;background:#eee;color:#222}
main{max-width:28rem;margin:2rem auto;background:#fff;border:1px solid #ccc;padding:1.5rem}
h1{font-size:1.25rem;margin:0 0 .25rem}.sub{color:#555;margin:0 0 1rem}
label{display:block;margin:.75rem 0 0;font-weight:600}input{display:block;width:100%;box-sizing:border-box;padding:.5rem;border:1px solid #888;font:inherit;font-weight:400}
.check{display:flex;gap:.5rem;align-items:flex-start;font-weight:400}.check input{width:auto;margin-top:.3rem}
button{margin-top:1rem;width:100%;padding:.6rem;font:inherit;font-weight:700;background:#333;color:#fff;border:0;cursor:pointer}button.later{background:#fff;color:#333;border:1px solid #333}
.err{background:#fdecea;border:1px solid #a33;color:#8a1c1c;padding:.5rem}.note{font-size:.85rem;color:#555}
:focus-visible{outline:3px solid #36c;outline-offset:2px}`;

function onboardingPage(account, { error = '', values = {} } = {}) {
  const name = values.businessName ?? account.business_profile.name ?? '';
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Set up payouts · ${esc(name || account.id)}</title><style>${PAGE_STYLE}</style></head><body><main>
<p class="sub">Test onboarding page · local only</p>
<h1>Set up payouts for ${esc(name || 'your business')}</h1>
<p>Tell us where to send the money your members pay. Account ${esc(account.id)}, country ${esc(account.country)}.</p>
${error ? `<p class="err" role="alert">${esc(error)}</p>` : ''}
<form method="post" novalidate>
  <label>Business name <input name="businessName" autocomplete="organization" value="${esc(name)}" required></label>
  <label>Bank account for payouts (IBAN) <input name="iban" autocomplete="off" spellcheck="false" value="${esc(values.iban ?? '')}" required></label>
  <label class="check"><input type="checkbox" name="terms" value="yes"${values.terms ? ' checked' : ''}> I accept the test service agreement.</label>
  <button type="submit" name="intent" value="submit">Agree and submit</button>
  <button type="submit" name="intent" value="later" class="later">Save and finish later</button>
</form>
<p class="note">Local test onboarding: nothing is verified with a bank. The example IBAN DE89 3704 0044 0532 0130 00 passes the check digits.</p>
</main></body></html>`;
}

/** GET shows the form; POST finishes (or leaves) onboarding and answers where to send the person. */
function onboardingRequest(token, method, form) {
  const link = state.links[token];
  if (!link) return { status: 404, html: '<!doctype html><title>Not found</title><p>This onboarding link does not exist.</p>' };
  const account = state.accounts[link.account];
  // A used or expired link sends the person to refresh_url, where the platform makes a new one.
  if (link.used || link.expiresAt <= realNow() || !account) return { redirect: link.refreshUrl };
  if (method === 'GET') return { status: 200, html: onboardingPage(account) };
  const values = { businessName: String(form.businessName ?? '').trim(), iban: String(form.iban ?? '').trim(), terms: form.terms === 'yes' };
  if (form.intent === 'later') {
    link.used = true;
    if (values.businessName) account.business_profile.name = values.businessName;
    return { redirect: link.returnUrl };
  }
  const fail = (error) => ({ status: 400, html: onboardingPage(account, { error, values }) });
  if (!values.businessName) return fail('Enter the business name members will see on their statements.');
  if (!ibanValid(values.iban)) return fail('That IBAN is not valid. Check the country code, the check digits and the account number.');
  if (!values.terms) return fail('Accept the service agreement to receive payouts.');
  link.used = true;
  setOnboarding(account, 'complete', { businessName: values.businessName, iban: values.iban.replace(/\s+/g, '').toUpperCase() });
  return { redirect: link.returnUrl };
}

// ---------------------------------------------------------------------------------------------
// Server

const idempotent = new Map(); // Idempotency-Key -> { status, body, at }

async function readBody(req) {
  const chunks = [];
  let size = 0;
  for await (const c of req) {
    size += c.length;
    if (size > 1024 * 1024) throw new ApiError(413, 'invalid_request_error', 'Request body too large.');
    chunks.push(c);
  }
  return Buffer.concat(chunks).toString('utf8');
}

function authorized(req) {
  const auth = req.headers.authorization ?? '';
  const bearer = /^Bearer (.+)$/.exec(auth)?.[1];
  const basic = /^Basic (.+)$/.exec(auth)?.[1];
  const key = bearer ?? (basic ? Buffer.from(basic, 'base64').toString().split(':')[0] : '');
  const a = Buffer.from(key ?? '');
  const b = Buffer.from(SECRET_KEY);
  return a.length === b.length && crypto.timingSafeEqual(a, b);
}

const server = http.createServer(async (req, res) => {
  const url = new URL(req.url, PUBLIC_URL);
  try {
    const payMatch = /^\/pay\/(cs_test_[A-Za-z0-9]+)$/.exec(url.pathname);
    if (payMatch) {
      const session = state.sessions[payMatch[1]];
      if (!session) return send(res, 404, '<!doctype html><title>Not found</title><p>This payment page does not exist.</p>');
      if (req.method === 'GET') return send(res, 200, payPage(session));
      if (req.method === 'POST') {
        const out = payPost(session, parseForm(await readBody(req)));
        save();
        if (out.redirect) return send(res, 303, '', { location: out.redirect });
        return send(res, out.status, out.html);
      }
      return send(res, 405, 'Method not allowed');
    }
    const onboardMatch = /^\/connect\/onboarding\/([A-Za-z0-9_-]+)$/.exec(url.pathname);
    if (onboardMatch) {
      if (req.method !== 'GET' && req.method !== 'POST') return send(res, 405, 'Method not allowed');
      const out = onboardingRequest(onboardMatch[1], req.method, req.method === 'POST' ? parseForm(await readBody(req)) : {});
      if (req.method === 'POST') save();
      if (out.redirect) return send(res, 303, '', { location: out.redirect });
      return send(res, out.status, out.html);
    }
    if (url.pathname === '/' || url.pathname === '/health') return send(res, 200, { ok: true, service: 'roundmark payments fake' });

    if (!authorized(req)) {
      throw new ApiError(401, 'invalid_request_error', 'Invalid API Key provided. Use the local secret key from docker-free-dev/local.env.', { code: 'api_key_invalid' });
    }
    const r = routes.find((x) => x.method === req.method && x.re.test(url.pathname));
    if (!r) throw new ApiError(404, 'invalid_request_error', `Unrecognized request URL (${req.method}: ${url.pathname}).`);
    const onAccount = req.headers['stripe-account'] || null;
    if (onAccount && !state.accounts[onAccount]) {
      throw new ApiError(403, 'invalid_request_error', `The provided key does not have access to account '${onAccount}' (or that account does not exist).`, { code: 'account_invalid' });
    }
    const idemKey = req.method === 'POST' && req.headers['idempotency-key'] ? `${req.headers['stripe-account'] ?? ''}:${req.headers['idempotency-key']}` : undefined;
    if (idemKey && idempotent.has(idemKey)) {
      const hit = idempotent.get(idemKey);
      return send(res, hit.status, hit.body, { 'idempotent-replayed': 'true' });
    }
    const text = await readBody(req);
    const isJson = (req.headers['content-type'] ?? '').includes('application/json');
    const params = text ? (isJson ? JSON.parse(text) : parseForm(text)) : {};
    const query = parseForm(url.search.slice(1));
    // Handlers run synchronously, so the scope set here is the one they see.
    scope.api = url.pathname.startsWith('/v1/');
    scope.account = scope.api ? onAccount : null;
    let result;
    try {
      result = r.handler(params, query, r.re.exec(url.pathname).slice(1).map(decodeURIComponent));
    } finally {
      scope.api = false;
      scope.account = null;
    }
    const expandFields = [].concat(params.expand ?? [], query.expand ?? []);
    const body = expandFields.length ? expand(result, expandFields) : result;
    if (req.method !== 'GET') save();
    if (idemKey) {
      idempotent.set(idemKey, { status: 200, body, at: Date.now() });
      if (idempotent.size > 5000) idempotent.delete(idempotent.keys().next().value);
    }
    return send(res, 200, body);
  } catch (err) {
    if (err instanceof ApiError) return send(res, err.status, err.body);
    if (err instanceof SyntaxError) return send(res, 400, { error: { type: 'invalid_request_error', message: 'The body could not be parsed.' } });
    console.error(err);
    return send(res, 500, { error: { type: 'api_error', message: 'The payments fake failed; see its log.' } });
  }
});

load();
server.listen(port, host, () => {
  console.log(`payments fake on ${PUBLIC_URL} (state in ${path.relative(repoRoot, stateFile)}; webhooks to ${DEFAULT_WEBHOOK_URL ?? 'registered endpoints only'})`);
});
for (const sig of ['SIGINT', 'SIGTERM']) process.on(sig, () => server.close(() => process.exit(0)));

// Differences from the real service (deliberate, to stay small):
// - Only the subset above: monthly recurring prices, percent-off coupons with duration once or
//   forever, one line item per checkout, mode=subscription, hosted page only. Anything else is
//   refused with an invalid_request_error naming the limit.
// - Customers who subscribe through POST /v1/subscriptions are taken to have the succeeding test
//   card on file; the real service needs a payment method (or a trial / payment_behavior).
// - Time: each subscription has its own clock, moved only by /_control/advance (no real billing
//   runs in the background; trials never end on their own). Event `created` uses that clock.
// - A "once" coupon is used by the first invoice that charges (the one after the trial); the
//   $0 trial invoice does not use it up. Dunning is one failed attempt -> past_due; "pay" settles.
// - Webhooks go to registered endpoints plus PAYMENTS_WEBHOOK_URL / $PUBLIC_BASE_URL, all signed
//   with the one PAYMENTS_WEBHOOK_SECRET (the real service has a secret per endpoint); three
//   attempts (now, +1 s, +4 s) instead of days of retries; delivered in order per endpoint.
// - Idempotency keys are remembered in memory only (lost on restart); no rate limits; no
//   livemode, no 3-D Secure, no taxes, no proration, no invoice PDFs.
// - Connected accounts: objects made with a Stripe-Account header belong to that account and are
//   unknown to every other account and to the platform (404), as with direct charges. Onboarding
//   is one page (business name, IBAN, terms) that sets charges and payouts on at once; no
//   identity checks, no persons, no capabilities requested one by one, no transfers or payouts,
//   no application fee objects (the fee shows only as invoices' application_fee_amount). Events
//   of connected accounts go to endpoints made with connect=true and to PAYMENTS_WEBHOOK_URL,
//   signed with the same secret (the real service gives the Connect endpoint its own secret).
// - Expiry of promotion codes is checked against the real clock, not a subscription's clock.
