import type { StripeObject } from "./store";

const esc = (s: unknown) =>
  String(s ?? "").replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);

function money(cents: number, currency: string): string {
  return new Intl.NumberFormat("en-US", { style: "currency", currency: currency.toUpperCase() }).format(cents / 100);
}

/**
 * The local test payment page: Layerwright's own palette (paper, ink, kiln), plainly marked as a
 * test page of the local fake. It posts the card number back to the fake and nothing else.
 */
export function renderCheckoutPage(session: StripeObject, opts: { error?: string; notice?: string } = {}): string {
  const items = ((session._line_items as StripeObject[] | undefined) ?? [])
    .map((li) => `<li><span>${esc(li.description)}${Number(li.quantity) > 1 ? ` × ${esc(li.quantity)}` : ""}</span><span>${esc(money(Number(li.amount_total), String(li.currency)))}</span></li>`)
    .join("");
  const open = session.status === "open";
  const total = money(Number(session.amount_total), String(session.currency));
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Test payment · Layerwright (local)</title>
<style>
  :root { --paper:#fbfaf7; --paper2:#f4f1ea; --line:#e8e3d7; --ink:#181d23; --ink5:#4d5662; --kiln:#d9692a; --kiln7:#93401a; --tide:#22706a; --danger:#b42318; }
  * { box-sizing: border-box; }
  body { margin:0; font:15px/1.5 ui-sans-serif, system-ui, sans-serif; color:var(--ink); background:var(--paper2); }
  .band { background: repeating-linear-gradient(135deg, #fadfcb 0 14px, #fdf2ea 14px 28px); color:var(--kiln7); text-align:center; padding:.5rem 1rem; font-weight:600; font-size:13px; letter-spacing:.02em; }
  main { max-width: 30rem; margin: 2rem auto; padding: 0 1rem; }
  .card { background:var(--paper); border:1px solid var(--line); border-radius:.3rem; padding:1.5rem; }
  h1 { font-size:1.35rem; margin:0 0 .25rem; } .muted { color:var(--ink5); font-size:13px; }
  ul { list-style:none; padding:0; margin:1rem 0; border-top:1px solid var(--line); }
  li { display:flex; justify-content:space-between; gap:1rem; padding:.5rem 0; border-bottom:1px solid var(--line); }
  .total { display:flex; justify-content:space-between; font-weight:700; font-size:1.125rem; margin-bottom:1.25rem; }
  label { display:block; font-weight:600; font-size:13px; margin-bottom:.25rem; }
  input { width:100%; font:inherit; font-family:ui-monospace, monospace; padding:.6rem .7rem; border:1px solid #d6cfbf; border-radius:.3rem; background:#fff; }
  input:focus { outline:2px solid var(--tide); outline-offset:1px; }
  button { margin-top:1rem; width:100%; font:inherit; font-weight:700; color:#fff; background:var(--kiln7); border:0; border-radius:.3rem; padding:.7rem; cursor:pointer; }
  button:hover { background:#7a3514; }
  .error { color:var(--danger); background:#fdecea; border:1px solid #f5c2bd; border-radius:.3rem; padding:.5rem .75rem; margin-bottom:1rem; font-weight:600; }
  .notice { color:var(--tide); background:#ecf6f5; border:1px solid #cfe9e6; border-radius:.3rem; padding:.5rem .75rem; margin-bottom:1rem; }
  .hint { margin-top:1rem; font-size:13px; color:var(--ink5); } code { font-family:ui-monospace, monospace; }
  a { color:var(--tide); }
  .brand { display:flex; align-items:center; gap:.5rem; margin-bottom:1rem; color:var(--ink5); font-size:14px; } .brand strong { color:var(--ink); }
</style></head>
<body>
<div class="band" role="note">LOCAL TEST PAYMENT PAGE — served by the development fake; no card is charged and no money moves</div>
<main>
<header class="brand"><svg viewBox="0 0 32 32" width="28" height="28" aria-hidden="true"><rect x="3" y="21" width="22" height="6" rx="3" fill="#d9692a"/><rect x="6" y="13.5" width="20" height="6" rx="3" fill="#e98a4c"/><rect x="9" y="6" width="18" height="6" rx="3" fill="#fadfcb"/><path d="M27 4v25" stroke="#242b33" stroke-width="2.4" stroke-linecap="round"/></svg><span><strong>Layerwright</strong> · local test payment</span></header>
<div class="card">
  <h1>Pay ${esc(total)}</h1>
  <p class="muted">${session.customer_email ? `Confirmation to ${esc(session.customer_email)}` : "A card payment to the bureau"}</p>
  <ul>${items}</ul>
  <div class="total"><span>Total</span><span>${esc(total)}</span></div>
  ${opts.error ? `<div class="error" role="alert">${esc(opts.error)}</div>` : ""}
  ${opts.notice ? `<div class="notice" role="status">${esc(opts.notice)}</div>` : ""}
  ${
    open
      ? `<form method="post" action="/checkout/${esc(session.id)}/pay">
    <label for="card">Test card number</label>
    <input id="card" name="card" inputmode="numeric" autocomplete="off" placeholder="4242 4242 4242 4242" required>
    <button type="submit">Pay ${esc(total)}</button>
  </form>
  <p class="hint">Test numbers: <code>4242 4242 4242 4242</code> succeeds, <code>4000 0000 0000 0002</code> is declined.</p>`
      : `<p>This payment is ${session.status === "complete" ? "complete" : "no longer open"}.</p>`
  }
  ${session.cancel_url && open ? `<p class="hint"><a href="${esc(session.cancel_url)}" id="cancel">Cancel and go back</a></p>` : ""}
</div>
<p class="hint">This page stands in for the card processor's payment page while Layerwright runs on this machine. With the hosted service configured, clients pay on the processor's own page instead.</p>
</main>
</body></html>`;
}

export function renderNotFoundPage(): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Not found · local test payment page</title></head><body style="font-family:system-ui;background:#f4f1ea;color:#181d23;padding:2rem"><p><strong>Local test payment page:</strong> this payment does not exist.</p></body></html>`;
}
