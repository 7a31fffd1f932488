import { escapeHtml } from '../lib/html';

/**
 * Pages of the payment stand-in: the hosted payment page a client is sent to, the pages for a
 * payment that is over, and an overview of sessions and webhook deliveries for the demo. They have a
 * look of their own (this is a test page, and says so), no scripts, and only their own inline style.
 * Everything shown came from an API caller or a form, so everything is escaped.
 */

/**
 * No `form-action`: Chromium applies it to the redirect after a form post, and a successful payment
 * redirects to the app's success URL on another origin.
 */
export const pageHeaders: Readonly<Record<string, string>> = {
  'Content-Security-Policy':
    "default-src 'none'; style-src 'unsafe-inline'; base-uri 'none'; frame-ancestors 'none'",
  'X-Content-Type-Options': 'nosniff',
  'Referrer-Policy': 'no-referrer',
  'Cache-Control': 'no-store',
};

export type CardField = 'email' | 'number' | 'expiry' | 'cvc' | 'name';

export interface CheckoutView {
  action: string;
  amountText: string;
  lineItems: { name: string; description: string | null; quantity: number; amountText: string }[];
  /** Known from the session; the form asks for an address when null. */
  customerEmail: string | null;
  cancelUrl: string | null;
  expiresAtText: string;
}

export interface CheckoutForm {
  values: Partial<Record<CardField, string>>;
  errors: Partial<Record<CardField, string>>;
  /** A decline or other refusal of the whole payment. */
  problem: string | null;
}

export interface TestCardRow {
  number: string;
  outcome: string;
}

const styles = `
*,*::before,*::after{box-sizing:border-box}
html{-webkit-text-size-adjust:100%}
body{margin:0;background:#f3f4ef;color:#1d2433;
  font:1rem/1.5 system-ui,-apple-system,"Segoe UI",Roboto,"Helvetica Neue",Arial,sans-serif}
.test-band p{margin:0}
.test-band{margin:0;padding:.5rem 1rem;background:#fff1c2;color:#3b2f00;border-bottom:2px dashed #8a6d00;
  text-align:center;font-weight:600}
main{max-width:30rem;margin:1.5rem auto;padding:0 1rem}
main.wide{max-width:72rem}
.sheet{background:#fff;border:1px solid #c9ced6;border-radius:.5rem;padding:1.25rem;margin-bottom:1rem}
h1{margin:0 0 .25rem;font-size:1.5rem;line-height:1.25}
h2{margin:0 0 .5rem;font-size:1.125rem}
p{margin:0 0 1rem}
.lede{color:#465062}
table{border-collapse:collapse;width:100%}
th,td{padding:.375rem .5rem;border-top:1px solid #dde1e7;text-align:left;vertical-align:top;overflow-wrap:anywhere}
th{font-weight:600}
td.num,th.num{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}
tfoot th,tfoot td{border-top:2px solid #1d2433;font-weight:700}
caption{text-align:left;font-weight:600;padding:0 0 .25rem}
.item-note{display:block;color:#465062;font-size:.875rem}
.field{display:flex;flex-direction:column;gap:.25rem;margin-bottom:1rem}
.pair{display:grid;grid-template-columns:repeat(auto-fit,minmax(8.5rem,1fr));gap:0 1rem}
label{font-weight:600}
.hint{margin:0;color:#465062;font-size:.875rem}
input{font:inherit;min-height:2.75rem;width:100%;padding:.5rem .75rem;border:1px solid #5f6b7a;border-radius:.375rem;
  background:#fff;color:inherit}
input[aria-invalid="true"]{border:2px solid #a61b1b}
.field-error{margin:0;color:#a61b1b;font-weight:600}
button{font:inherit;font-weight:700;min-height:2.75rem;width:100%;padding:.5rem 1rem;border:0;border-radius:.375rem;
  background:#1f4e79;color:#fff;cursor:pointer}
button:hover{background:#173b5c}
:focus-visible{outline:3px solid #1f4e79;outline-offset:2px}
button:focus-visible{outline-color:#1d2433}
.problem{margin:0 0 1rem;padding:.75rem 1rem;border:2px solid #a61b1b;border-radius:.375rem;background:#fdf1f1;color:#7d1414}
.problem p{margin:0}
a{color:#1f4e79}
.actions{margin:1rem 0 0}
details{margin-top:1rem}
summary{cursor:pointer;font-weight:600}
code{font:.9375rem/1.4 ui-monospace,SFMono-Regular,Menlo,Consolas,monospace}
.scroll{overflow-x:auto}
.scroll:focus-visible{outline-offset:0}
.state-delivered{color:#1d5c2e;font-weight:600}
.state-failed{color:#a61b1b;font-weight:600}
footer{max-width:30rem;margin:0 auto 2rem;padding:0 1rem;font-size:.875rem;color:#465062}
footer.wide{max-width:72rem}
`;

function page(title: string, body: string, options: { wide?: boolean } = {}): string {
  const wide = options.wide ? ' class="wide"' : '';
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)} – test payment</title>
<style>${styles}</style>
</head>
<body>
<header class="test-band"><p>Test payment page: no real card is charged and no money moves.</p></header>
<main${wide}>
${body}
</main>
<footer${wide}>A local stand-in for the payment provider, for development and tests. Nothing here leaves this computer.</footer>
</body>
</html>`;
}

const fieldIds: Record<CardField, string> = {
  email: 'pay-email',
  number: 'card-number',
  expiry: 'card-expiry',
  cvc: 'card-cvc',
  name: 'card-name',
};

interface FieldSpec {
  field: CardField;
  label: string;
  hint: string | null;
  attributes: string;
}

function fieldHtml(spec: FieldSpec, form: CheckoutForm, autofocus: boolean): string {
  const id = fieldIds[spec.field];
  const error = form.errors[spec.field];
  const described = [spec.hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ');
  const value = form.values[spec.field] ?? '';
  return `<div class="field">
<label for="${id}">${escapeHtml(spec.label)}</label>
${spec.hint ? `<p class="hint" id="${id}-hint">${escapeHtml(spec.hint)}</p>\n` : ''}<input id="${id}" name="${spec.field}" ${spec.attributes} value="${escapeHtml(value)}"${
    described ? ` aria-describedby="${described}"` : ''
  }${error ? ' aria-invalid="true"' : ''}${autofocus ? ' autofocus' : ''}>
${error ? `<p class="field-error" id="${id}-error">${escapeHtml(error)}</p>\n` : ''}</div>`;
}

function testCardTable(cards: readonly TestCardRow[]): string {
  const rows = cards
    .map(
      (card) =>
        `<tr><td><code>${escapeHtml(card.number)}</code></td><td>${escapeHtml(card.outcome)}</td></tr>`,
    )
    .join('\n');
  return `<details>
<summary>Test cards</summary>
<p class="hint">Use any expiry date in the future and any three digits as the security code.</p>
<div class="scroll" role="region" aria-label="Test card numbers" tabindex="0"><table>
<thead><tr><th scope="col">Card number</th><th scope="col">What happens</th></tr></thead>
<tbody>
${rows}
</tbody>
</table></div>
</details>`;
}

export function checkoutPage(view: CheckoutView, form: CheckoutForm, cards: readonly TestCardRow[]): string {
  const specs: FieldSpec[] = [
    ...(view.customerEmail === null
      ? [
          {
            field: 'email' as const,
            label: 'Email for the receipt',
            hint: 'The payment confirmation goes to this address.',
            attributes: 'type="email" autocomplete="email" autocapitalize="none" spellcheck="false" required',
          },
        ]
      : []),
    {
      field: 'number',
      label: 'Card number',
      hint: 'The 16 digits on the front; spaces are fine.',
      attributes: 'type="text" inputmode="numeric" autocomplete="cc-number" spellcheck="false" required',
    },
    {
      field: 'expiry',
      label: 'Expiry date',
      hint: 'MM/YY, for example 04/29.',
      attributes: 'type="text" inputmode="numeric" autocomplete="cc-exp" spellcheck="false" required',
    },
    {
      field: 'cvc',
      label: 'Security code',
      hint: 'Three or four digits, usually on the back.',
      attributes: 'type="text" inputmode="numeric" autocomplete="cc-csc" spellcheck="false" required',
    },
    {
      field: 'name',
      label: 'Name on the card',
      hint: 'As it is printed on the card.',
      attributes: 'type="text" autocomplete="cc-name" required',
    },
  ];
  const firstInvalid = specs.find((spec) => form.errors[spec.field])?.field ?? null;
  const fields = specs.map((spec) => fieldHtml(spec, form, spec.field === firstInvalid));
  // Expiry and security code share a row where there is room.
  const [emailField, numberField, expiryField, cvcField, nameField] =
    view.customerEmail === null ? fields : [null, ...fields];
  const problem = form.problem
    ? `<div class="problem" id="payment-problem" role="alert" tabindex="-1"${firstInvalid ? '' : ' autofocus'}><p>${escapeHtml(form.problem)}</p></div>\n`
    : '';
  const itemRows = view.lineItems
    .map(
      (item) =>
        `<tr><td>${escapeHtml(item.name)}${item.description ? `<span class="item-note">${escapeHtml(item.description)}</span>` : ''}</td><td class="num">${item.quantity}</td><td class="num">${escapeHtml(item.amountText)}</td></tr>`,
    )
    .join('\n');
  const paying = view.customerEmail
    ? `<p class="lede">Paying as ${escapeHtml(view.customerEmail)}. This page can be used until ${escapeHtml(view.expiresAtText)}.</p>`
    : `<p class="lede">This page can be used until ${escapeHtml(view.expiresAtText)}.</p>`;
  const cancel = view.cancelUrl
    ? `<p class="actions"><a href="${escapeHtml(view.cancelUrl)}">Cancel and go back without paying</a></p>`
    : '';
  return page(
    `Pay ${view.amountText}`,
    `<h1>Pay ${escapeHtml(view.amountText)}</h1>
${paying}
<div class="sheet">
<div class="scroll" role="region" aria-label="What this payment is for" tabindex="0"><table>
<caption>What this payment is for</caption>
<thead><tr><th scope="col">Item</th><th scope="col" class="num">Qty</th><th scope="col" class="num">Amount</th></tr></thead>
<tbody>
${itemRows}
</tbody>
<tfoot><tr><th scope="row" colspan="2">Total</th><td class="num">${escapeHtml(view.amountText)}</td></tr></tfoot>
</table></div>
</div>
<form class="sheet" method="post" action="${escapeHtml(view.action)}" novalidate>
<h2>Card details</h2>
${problem}${emailField ?? ''}${numberField}
<div class="pair">
${expiryField}
${cvcField}
</div>
${nameField}
<button type="submit">Pay ${escapeHtml(view.amountText)}</button>
</form>
${cancel}
${testCardTable(cards)}`,
  );
}

/** A payment that can no longer be made here: paid, expired or unknown. */
export function closedPage(opts: {
  title: string;
  message: string;
  link?: { href: string; text: string } | null;
}): string {
  const link = opts.link
    ? `<p class="actions"><a href="${escapeHtml(opts.link.href)}">${escapeHtml(opts.link.text)}</a></p>`
    : '';
  return page(
    opts.title,
    `<h1>${escapeHtml(opts.title)}</h1>
<div class="sheet"><p>${escapeHtml(opts.message)}</p></div>
${link}`,
  );
}

export interface OverviewSession {
  id: string;
  amountText: string;
  status: string;
  createdText: string;
  payUrl: string | null;
}

export interface OverviewEvent {
  id: string;
  type: string;
  createdText: string;
  status: string;
  attempts: string;
}

export function overviewPage(sessions: readonly OverviewSession[], events: readonly OverviewEvent[]): string {
  const sessionRows = sessions
    .map(
      (session) =>
        `<tr><td><code>${escapeHtml(session.id)}</code></td><td class="num">${escapeHtml(session.amountText)}</td><td>${escapeHtml(session.status)}</td><td>${escapeHtml(session.createdText)}</td><td>${
          session.payUrl ? `<a href="${escapeHtml(session.payUrl)}">Payment page</a>` : '—'
        }</td></tr>`,
    )
    .join('\n');
  const eventRows = events
    .map(
      (event) =>
        `<tr><td><code>${escapeHtml(event.id)}</code></td><td>${escapeHtml(event.type)}</td><td>${escapeHtml(event.createdText)}</td><td class="state-${escapeHtml(event.status)}">${escapeHtml(event.status)}</td><td>${escapeHtml(event.attempts)}</td></tr>`,
    )
    .join('\n');
  const sessionTable =
    sessions.length === 0
      ? '<p>No checkout sessions yet. They appear here when the app starts an online payment.</p>'
      : `<div class="scroll" role="region" aria-label="Checkout sessions" tabindex="0"><table>
<caption>Checkout sessions, newest first</caption>
<thead><tr><th scope="col">Session</th><th scope="col" class="num">Amount</th><th scope="col">Status</th><th scope="col">Created (UTC)</th><th scope="col">Pay</th></tr></thead>
<tbody>
${sessionRows}
</tbody>
</table></div>`;
  const eventTable =
    events.length === 0
      ? '<p>No events yet. A payment or an expired session sends one to the app’s webhook.</p>'
      : `<div class="scroll" role="region" aria-label="Webhook events" tabindex="0"><table>
<caption>Webhook events, newest first</caption>
<thead><tr><th scope="col">Event</th><th scope="col">Type</th><th scope="col">Created (UTC)</th><th scope="col">Delivery</th><th scope="col">Attempts (HTTP status)</th></tr></thead>
<tbody>
${eventRows}
</tbody>
</table></div>`;
  return page(
    'Payment stand-in',
    `<h1>Payment stand-in</h1>
<p class="lede">Checkout sessions the app created and the events sent to its webhook. Reload to see new ones; the same lists are at <a href="/_stand-in/sessions">/_stand-in/sessions</a> and <a href="/_stand-in/events">/_stand-in/events</a> as JSON.</p>
<section class="sheet" aria-labelledby="sessions-heading"><h2 id="sessions-heading">Sessions</h2>
${sessionTable}
</section>
<section class="sheet" aria-labelledby="events-heading"><h2 id="events-heading">Events</h2>
${eventTable}
</section>`,
    { wide: true },
  );
}
