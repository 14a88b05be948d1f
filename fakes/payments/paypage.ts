// The hosted pay page a checkout session's `url` points at: the basket, a card number field, Pay and
// Cancel. Test cards only; see cards.ts.
import type { ServerResponse } from 'node:http';
import { DECLINE_CARD, SUCCESS_CARD } from './cards';
import type { Ctx } from './context';
import { ApiError } from './errors';
import type { FormObject } from './form';
import { redirect, sendHtml } from './http';
import { paySession } from './payment';
import type { ApiObject } from './state';

const escapeHtml = (s: string) =>
  s.replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string,
  );

/** Minor units → display amount; the number of decimals comes from ISO 4217 via Intl. */
export function formatMoney(minor: number, currency: string): string {
  const fmt = new Intl.NumberFormat('en', { style: 'currency', currency: currency.toUpperCase() });
  const digits = fmt.resolvedOptions().maximumFractionDigits ?? 2;
  return fmt.format(minor / 10 ** digits);
}

function page(title: string, body: string): string {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<style>
body{font-family:system-ui,sans-serif;max-width:30rem;margin:2rem auto;padding:0 1rem;color:#1d2421}
table{width:100%;border-collapse:collapse;margin:1rem 0}td{padding:.3rem 0;border-bottom:1px solid #dde3df}
td.n{text-align:right}.total td{font-weight:700;border:0}
label{display:block;margin:.8rem 0 .3rem}input{width:100%;padding:.6rem;font-size:1.1rem;box-sizing:border-box}
.actions{display:flex;gap:.6rem;margin-top:1rem}button{padding:.6rem 1.2rem;font-size:1rem;cursor:pointer}
.alert{background:#fde8e8;border:1px solid #d33;padding:.6rem;margin:1rem 0}.hint{color:#5a6660;font-size:.9rem}
</style></head><body>
<p class="hint">Payments fake — a local test page; no real money moves.</p>
${body}
</body></html>`;
}

export function renderPayPage(session: ApiObject, items: ApiObject[], message?: string): string {
  const cur = session.currency as string;
  const rows = items
    .map(
      (li) =>
        `<tr><td>${escapeHtml(String(li.description))} × ${String(li.quantity)}</td><td class="n">${formatMoney(li.amount_total as number, cur)}</td></tr>`,
    )
    .join('');
  const alert = message ? `<p class="alert" role="alert">${escapeHtml(message)}</p>` : '';
  return page(
    'Pay',
    `<h1>Pay ${formatMoney(session.amount_total as number, cur)}</h1>
<table>${rows}<tr class="total"><td>Total</td><td class="n">${formatMoney(session.amount_total as number, cur)}</td></tr></table>
${alert}
<form method="post" action="/pay/${encodeURIComponent(session.id)}">
<label for="card">Card number</label>
<input id="card" name="card" inputmode="numeric" autocomplete="cc-number" placeholder="${SUCCESS_CARD}" required>
<p class="hint">Test cards: ${SUCCESS_CARD} succeeds, ${DECLINE_CARD} is declined.</p>
<div class="actions">
<button type="submit" name="action" value="pay">Pay</button>
<button type="submit" name="action" value="cancel" formnovalidate>Cancel</button>
</div>
</form>`,
  );
}

function closedPage(session: ApiObject): string {
  if (session.status === 'complete') {
    return page('Paid', `<h1>Already paid</h1><p>This payment is complete.</p>`);
  }
  return page('Expired', `<h1>This payment page has expired</h1><p>Start again from the shop.</p>`);
}

export function showPayPage(ctx: Ctx, res: ServerResponse, id: string): void {
  const session = ctx.state.sessions[id];
  if (!session) return sendHtml(res, 404, page('Not found', '<h1>No such payment page</h1>'));
  if (session.status !== 'open')
    return sendHtml(res, session.status === 'expired' ? 410 : 200, closedPage(session));
  sendHtml(res, 200, renderPayPage(session, ctx.state.lineItems[id] ?? []));
}

export function submitPayPage(ctx: Ctx, res: ServerResponse, id: string, form: FormObject): void {
  const session = ctx.state.sessions[id];
  if (!session) return sendHtml(res, 404, page('Not found', '<h1>No such payment page</h1>'));
  if (session.status !== 'open') return sendHtml(res, 409, closedPage(session));
  if (form.action === 'cancel') {
    if (session.cancel_url) return redirect(res, session.cancel_url as string);
    return sendHtml(res, 200, page('Cancelled', '<h1>Payment cancelled</h1>'));
  }
  const items = ctx.state.lineItems[id] ?? [];
  try {
    const result = paySession(ctx, id, typeof form.card === 'string' ? form.card : '');
    if (result.outcome === 'declined')
      return sendHtml(res, 402, renderPayPage(session, items, result.message));
    redirect(res, (session.success_url as string).replaceAll('{CHECKOUT_SESSION_ID}', session.id));
  } catch (err) {
    if (!(err instanceof ApiError)) throw err;
    sendHtml(res, err.status, renderPayPage(session, items, err.message));
  }
}
