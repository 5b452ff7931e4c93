/**
 * The markup of the hosted payment page: what is being paid for, one card number field with its hint and
 * error, pay and cancel, and the pages shown once a checkout is paid or has expired. Plain HTML with inline
 * styles only, as the page's content security policy allows nothing else.
 */
import { escapeHtml } from '@vue/shared'
import { formatMoney } from './money'
import { successUrl } from './session-lifecycle'
import type { CheckoutSession, LineItem } from './types'

export function page(title: string, main: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<style>
  :root { color-scheme: light; font-family: system-ui, sans-serif; line-height: 1.5; }
  body { margin: 0; background: #eef1ec; color: #1d2420; }
  main { max-width: 30rem; margin: 2.5rem auto; padding: 1.5rem 1.75rem; background: #fff; border: 2px solid #2f5d50; border-radius: 6px; }
  .banner { margin: 0 0 1rem; padding: .35rem .6rem; background: #fff4cc; border-left: 4px solid #8a6d00; font-size: .9rem; }
  h1 { font-size: 1.35rem; margin: 0 0 .75rem; }
  table { width: 100%; border-collapse: collapse; margin: 0 0 1rem; font-size: .95rem; }
  th, td { text-align: left; padding: .3rem 0; border-bottom: 1px solid #d5dbd3; }
  td.num, th.num { text-align: right; }
  label { display: block; font-weight: 600; margin-bottom: .25rem; }
  input { width: 100%; box-sizing: border-box; font: inherit; font-size: 1.1rem; padding: .5rem; border: 2px solid #59655d; border-radius: 4px; }
  input:focus, button:focus, a:focus { outline: 3px solid #c77d00; outline-offset: 2px; }
  input[aria-invalid="true"] { border-color: #a4161a; }
  .hint { font-size: .85rem; color: #4a544d; margin: .25rem 0 0; }
  .error { color: #a4161a; font-weight: 600; margin: .5rem 0 0; }
  .actions { display: flex; gap: 1rem; align-items: center; margin-top: 1.25rem; }
  button { font: inherit; font-weight: 600; padding: .55rem 1.4rem; background: #2f5d50; color: #fff; border: 0; border-radius: 4px; cursor: pointer; }
  details { margin-top: 1.25rem; font-size: .9rem; }
</style>
</head>
<body>
<main>
<p class="banner">Test environment: no real money moves.</p>
${main}
</main>
</body>
</html>`
}

export function payPage(session: CheckoutSession, lineItems: LineItem[], message: string | null, cardValue = ''): string {
  const total = formatMoney(session.amount_total, session.currency)
  const rows = lineItems
    .map((li) => `<tr><td>${escapeHtml(li.description)}</td><td class="num">${li.quantity}</td><td class="num">${escapeHtml(formatMoney(li.amount_total, li.currency))}</td></tr>`)
    .join('\n')
  const cancel = session.cancel_url ? `<a href="/pay/${encodeURIComponent(session.id)}/cancel">Cancel and go back</a>` : ''
  return page(
    `Pay ${total}`,
    `<h1>Pay ${escapeHtml(total)}</h1>
<table>
<caption class="hint">What you are paying for</caption>
<thead><tr><th scope="col">Item</th><th scope="col" class="num">Qty</th><th scope="col" class="num">Amount</th></tr></thead>
<tbody>
${rows}
</tbody>
<tfoot><tr><th scope="row" colspan="2">Total</th><td class="num">${escapeHtml(total)}</td></tr></tfoot>
</table>
<form method="post" action="/pay/${encodeURIComponent(session.id)}" novalidate>
<label for="card">Test card number</label>
<input id="card" name="card" type="text" inputmode="numeric" autocomplete="off" required value="${escapeHtml(cardValue)}"
  aria-describedby="card-hint${message ? ' card-error' : ''}"${message ? ' aria-invalid="true"' : ''}>
<p id="card-hint" class="hint">Spaces are allowed.</p>
${message ? `<p id="card-error" class="error" role="alert">${escapeHtml(message)}</p>` : ''}
<div class="actions">
<button type="submit">Pay ${escapeHtml(total)}</button>
${cancel}
</div>
</form>
<details>
<summary>Test card numbers</summary>
<ul>
<li>4242 4242 4242 4242: payment succeeds</li>
<li>4000 0000 0000 0002: card declined</li>
<li>4000 0000 0000 9995: insufficient funds</li>
</ul>
</details>`,
  )
}

export function closedPage(session: CheckoutSession): string {
  if (session.status === 'complete') {
    const back = session.success_url ? `<p><a href="${escapeHtml(successUrl(session))}">Return to the shop</a></p>` : ''
    return page('Payment received', `<h1>Payment received</h1><p>${escapeHtml(formatMoney(session.amount_total, session.currency))} has been paid.</p>${back}`)
  }
  const back = session.cancel_url ? `<p><a href="${escapeHtml(session.cancel_url)}">Go back</a></p>` : ''
  return page('Checkout expired', `<h1>This checkout has expired</h1><p>Start the payment again from the shop.</p>${back}`)
}
