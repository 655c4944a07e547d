// The fake's hosted pages: a card form for a checkout or an open invoice, and the authentication
// step some cards ask for. Plain HTML forms, no script, so any browser (and a test's fetch) can
// drive them. Clearly marked as a test page, so nobody takes it for a real payment form.
import { TEST_CARDS } from "./cards";

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
const money = (cents: number, currency: string) =>
  new Intl.NumberFormat("en-US", { style: "currency", currency: currency.toUpperCase() }).format(cents / 100);

const STYLE = `
  *{box-sizing:border-box} body{margin:0;font:16px/1.45 system-ui,sans-serif;background:#eef1f4;color:#17202a}
  main{max-width:440px;margin:32px auto;padding:0 16px} .card{background:#fff;border-radius:10px;padding:22px;box-shadow:0 1px 3px #0002}
  .test{background:#fff3cd;color:#664d03;border-radius:6px;padding:8px 12px;font-size:14px;margin-bottom:14px}
  h1{font-size:20px;margin:0 0 4px} .amount{font-size:28px;font-weight:600;margin:6px 0 16px}
  label{display:block;font-size:14px;font-weight:600;margin:12px 0 4px} input{width:100%;font:inherit;padding:10px;border:1px solid #9aa5b1;border-radius:6px}
  .row{display:flex;gap:10px} .row>div{flex:1}
  button{width:100%;margin-top:18px;font:inherit;font-weight:600;padding:12px;border:0;border-radius:6px;background:#1f5f8b;color:#fff;cursor:pointer}
  button.secondary{background:#e3e8ee;color:#17202a} .error{background:#fde2e1;color:#8a1c14;border-radius:6px;padding:10px 12px;margin:12px 0 0}
  table{width:100%;font-size:13px;border-collapse:collapse;margin-top:8px} td{padding:3px 0;vertical-align:top} td:first-child{font-family:ui-monospace,monospace;white-space:nowrap;padding-right:10px}
  a{color:#1f5f8b} .muted{color:#52606d;font-size:14px}`;

function page(title: string, body: string) {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">
<title>${esc(title)}</title><style>${STYLE}</style></head><body><main>
<div class="test" role="note">Test payment page of the local payments fake. No real card is charged.</div>
<div class="card">${body}</div></main></body></html>`;
}

const cardTable = `<p class="muted">Test card numbers (any future expiry, any CVC):</p><table>${TEST_CARDS.map(
  (c) => `<tr><td>${c.number.replace(/(\d{4})(?=\d)/g, "$1 ")}</td><td>${esc(c.label)}</td></tr>`,
).join("")}</table>`;

export function cardPage(p: { title: string; lineItem: string; amountCents: number; currency: string; action: string; error?: string; cancelUrl?: string | null; email?: string | null }) {
  return page(
    p.title,
    `<h1>${esc(p.title)}</h1><div class="muted">${esc(p.lineItem)}${p.email ? ` · ${esc(p.email)}` : ""}</div>
<div class="amount">${money(p.amountCents, p.currency)}</div>
<form method="post" action="${esc(p.action)}">
<label for="card">Card number</label><input id="card" name="card" inputmode="numeric" autocomplete="cc-number" required placeholder="4242 4242 4242 4242">
<div class="row"><div><label for="expiry">Expiry (MM/YY)</label><input id="expiry" name="expiry" required placeholder="12/34"></div>
<div><label for="cvc">CVC</label><input id="cvc" name="cvc" inputmode="numeric" required placeholder="123"></div></div>
<label for="holder">Name on card</label><input id="holder" name="holder" autocomplete="cc-name">
${p.error ? `<div class="error" role="alert">${esc(p.error)}</div>` : ""}
<button type="submit">Pay ${money(p.amountCents, p.currency)}</button></form>
${p.cancelUrl ? `<p><a href="${esc(p.cancelUrl)}">Cancel and go back</a></p>` : ""}${cardTable}`,
  );
}

export function authenticatePage(p: { action: string; amountCents: number; currency: string }) {
  return page(
    "Authenticate this payment",
    `<h1>Authenticate this payment</h1><p>Your bank asks you to confirm a payment of ${money(p.amountCents, p.currency)}.</p>
<form method="post" action="${esc(p.action)}"><button name="result" value="complete" type="submit">Complete authentication</button>
<button class="secondary" name="result" value="fail" type="submit">Fail authentication</button></form>`,
  );
}

export function messagePage(title: string, text: string, link?: { url: string; label: string }) {
  return page(title, `<h1>${esc(title)}</h1><p>${esc(text)}</p>${link ? `<p><a href="${esc(link.url)}">${esc(link.label)}</a></p>` : ""}`);
}
