import { escapeHtml } from '../lib/html';
/**
 * Pages of the Brinewatch ID stand-in. Self-contained HTML (no external resources); the
 * stand-in sends its own CSP, so the only inline content allowed is style.
 */

/** Sent with every page: no scripts, no framing (the sign-in form must not be clickjacked). */
export const pageSecurityHeaders: Readonly<Record<string, string>> = {
  'Content-Security-Policy':
    "default-src 'none'; style-src 'unsafe-inline'; img-src data:; base-uri 'none'; frame-ancestors 'none'",
  'X-Content-Type-Options': 'nosniff',
  'Referrer-Policy': 'no-referrer',
  'Cache-Control': 'no-store',
};

const styles = `
*,*::before,*::after{box-sizing:border-box}
html{-webkit-text-size-adjust:100%}
body{margin:0;min-height:100vh;display:flex;flex-direction:column;align-items:center;gap:1.25rem;
  padding:2rem 1rem;background:#e9f1f0;color:#10262b;
  font:1rem/1.5 system-ui,-apple-system,"Segoe UI",Roboto,"Helvetica Neue",Arial,sans-serif}
.brand{display:flex;align-items:center;gap:.5rem;font-weight:700;font-size:1.125rem;color:#0b5d66}
.brand svg{width:1.75rem;height:1.75rem}
main{width:100%;max-width:26rem;background:#fff;border-radius:.75rem;padding:1.5rem;
  box-shadow:0 1px 2px rgba(16,38,43,.08),0 4px 16px rgba(16,38,43,.08)}
h1{margin:0 0 .5rem;font-size:1.5rem;line-height:1.25}
p{margin:0 0 1rem}
.lede{color:#44585c}
.field{display:flex;flex-direction:column;gap:.25rem;margin-bottom:1rem}
label{font-weight:600}
input{font:inherit;min-height:2.75rem;padding:.5rem .75rem;border:1px solid #6b7f83;border-radius:.5rem;
  background:#fff;color:inherit;width:100%}
input[aria-invalid="true"]{border-color:#9b1c1c}
button{font:inherit;font-weight:600;min-height:2.75rem;width:100%;padding:.5rem 1rem;border:0;
  border-radius:.5rem;background:#0b5d66;color:#fff;cursor:pointer}
button:hover{background:#084950}
:focus-visible{outline:3px solid #0b5d66;outline-offset:2px}
button:focus-visible{outline-color:#10262b}
.error{margin:0 0 1rem;padding:.75rem 1rem;border-left:4px solid #9b1c1c;border-radius:.25rem;
  background:#fdf0ef;color:#7f1616}
.error p{margin:0}
dl{margin:0 0 1rem;display:grid;grid-template-columns:auto 1fr;gap:.25rem .75rem}
dt{font-weight:600}dd{margin:0;overflow-wrap:anywhere}
a{color:#0b5d66}
footer{max-width:26rem;text-align:center;font-size:.875rem;color:#44585c}
`;

const mark = `<svg viewBox="0 0 32 32" aria-hidden="true" focusable="false"><circle cx="16" cy="16" r="15" fill="#0b5d66"/><path d="M6 18c3-3 5-3 8 0s5 3 8 0 4-3 5-2" fill="none" stroke="#fff" stroke-width="2.5" stroke-linecap="round"/><path d="M6 23c3-3 5-3 8 0s5 3 8 0 4-3 5-2" fill="none" stroke="#9fd6d2" stroke-width="2.5" stroke-linecap="round"/></svg>`;

function page(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)} – Brinewatch ID</title>
<style>${styles}</style>
</head>
<body>
<header class="brand">${mark}<span>Brinewatch ID</span></header>
<main>
${body}
</main>
<footer>Local stand-in for the Brinewatch ID sign-in service. Accounts live only while it runs.</footer>
</body>
</html>`;
}

export function signInPage(opts: { action: string; email: string; failed: boolean }): string {
  const { action, email, failed } = opts;
  const invalid = failed ? ' aria-invalid="true" aria-describedby="sign-in-error"' : '';
  const error = failed
    ? `<div class="error" id="sign-in-error" role="alert"><p>That email and password don't match. Check them and try again.</p></div>\n`
    : '';
  // Focus goes where the typing is still to do: the email, or the password once an email is known.
  const focusEmail = email === '' ? ' autofocus' : '';
  const focusPassword = email === '' ? '' : ' autofocus';
  return page(
    'Sign in',
    `<h1>Sign in</h1>
<p class="lede">Use your Brinewatch ID to continue to Brinewatch.</p>
${error}<form method="post" action="${escapeHtml(action)}">
<div class="field"><label for="email">Email</label>
<input id="email" name="email" type="email" autocomplete="username" autocapitalize="none" spellcheck="false" required value="${escapeHtml(email)}"${invalid}${focusEmail}></div>
<div class="field"><label for="password">Password</label>
<input id="password" name="password" type="password" autocomplete="current-password" required${invalid}${focusPassword}></div>
<button type="submit">Sign in</button>
</form>`,
  );
}

/** `form` is oidc-provider's confirm form (carrying its xsrf field); the button and the "sign out everywhere" field go inside it. */
export function signOutPage(form: string): string {
  const controls = `<input type="hidden" name="logout" value="yes"><button type="submit" autofocus>Sign out of Brinewatch ID</button>`;
  const filled = form.includes('</form>')
    ? form.replace('</form>', `${controls}</form>`)
    : `${form}${controls}`;
  return page(
    'Sign out',
    `<h1>Sign out</h1>
<p>You are leaving Brinewatch. Finish by signing out of Brinewatch ID on this device too, so the next person here has to enter a password.</p>
${filled}`,
  );
}

export function signedOutPage(opts: { backTo: string | null }): string {
  const back = opts.backTo ? `<p><a href="${escapeHtml(opts.backTo)}">Back to Brinewatch</a></p>` : '';
  return page(
    'Signed out',
    `<h1>You're signed out</h1>
<p>You have signed out of Brinewatch ID on this device.</p>
${back}`,
  );
}

export function expiredInteractionPage(): string {
  return page(
    'Sign-in expired',
    `<h1>This sign-in page has expired</h1>
<p>Go back to Brinewatch and choose Sign in again.</p>`,
  );
}

export function errorPage(opts: { code: string; description: string | null }): string {
  const description = opts.description ? `<dt>Details</dt><dd>${escapeHtml(opts.description)}</dd>` : '';
  return page(
    'Something went wrong',
    `<h1>Something went wrong</h1>
<p>Brinewatch ID could not finish this request. Go back to Brinewatch and try again.</p>
<dl><dt>Error</dt><dd>${escapeHtml(opts.code)}</dd>${description}</dl>`,
  );
}
