import { escapeXml as escapeHtml } from './saml-response';
import type { DemoPerson } from './demo-people';

const style = `body{font-family:'Noto Sans',system-ui,sans-serif;background:#f3f1ea;color:#222;margin:0}
main{max-width:34rem;margin:3rem auto;background:#fff;border:1px solid #d8d3c4;border-radius:8px;padding:2rem}
h1{font-size:1.3rem;margin-top:0}.banner{background:#5b3f8c;color:#fff;padding:.6rem 1rem;font-size:.9rem}
label{display:block;margin:.8rem 0 .3rem;font-weight:600}select,input{width:100%;padding:.5rem;font-size:1rem}
button{margin-top:1.2rem;padding:.6rem 1.2rem;font-size:1rem;background:#5b3f8c;color:#fff;border:0;
  border-radius:5px;cursor:pointer}
.error{background:#fde8e8;border:1px solid #e5a5a5;padding:.6rem;border-radius:5px}.muted{color:#666;font-size:.85rem}
table{border-collapse:collapse;width:100%;font-size:.85rem;margin-top:1.5rem}
    td,th{border-bottom:1px solid #eee;padding:.3rem;text-align:left}`;

function page(title: string, body: string, script = ''): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(title)}</title>
      <style>${style}</style></head>
<body><div class="banner">Stand-in identity provider for local development and tests — not for production</div>
      <main>${body}</main>${script}</body></html>`;
}

const reauthenticationNote =
  '<p>Ingotrace asks you to enter your password again before it records your electronic signature.</p>';

export function signInPage(options: {
  requestToken: string;
  people: DemoPerson[];
  forceAuthn: boolean;
  error?: string;
  selectedSubject?: string;
}): string {
  const choices = options.people
    .map(
      (person) =>
        `<option value="${escapeHtml(person.subject)}"` +
        `${person.subject === options.selectedSubject ? ' selected' : ''}>${escapeHtml(person.name)} ` +
        `— ${escapeHtml(person.groups.join(', '))}${person.note ? ` (${escapeHtml(person.note)})` : ''}</option>`,
    )
    .join('');
  const rows = options.people
    .map((person) => `<tr><td>${escapeHtml(person.name)}</td><td><code>${escapeHtml(person.password)}</code></td></tr>`)
    .join('');
  return page(
    'Sign in',
    `<h1>${options.forceAuthn ? 'Confirm it is you' : 'Sign in to Ingotrace'}</h1>
${options.forceAuthn ? reauthenticationNote : ''}
${options.error ? `<p class="error" role="alert">${escapeHtml(options.error)}</p>` : ''}
<form method="post" action="/sso/sign-in">
<input type="hidden" name="request" value="${escapeHtml(options.requestToken)}">
<label for="subject">Person</label><select id="subject" name="subject">${choices}</select>
<label for="password">Password</label>
        <input id="password" name="password" type="password" autocomplete="current-password" required autofocus>
<button type="submit">Sign in</button>
</form>
<table><caption class="muted">Demo passwords</caption><tr><th>Person</th><th>Password</th></tr>${rows}</table>`,
  );
}

/** The HTTP-POST binding: a form that the browser submits to the service provider by itself. */
export function postBindingPage(acsUrl: string, samlResponse: string, relayState: string | undefined): string {
  return page(
    'Signing in…',
    `<form method="post" action="${escapeHtml(acsUrl)}">
<input type="hidden" name="SAMLResponse" value="${escapeHtml(samlResponse)}">
${relayState !== undefined ? `<input type="hidden" name="RelayState" value="${escapeHtml(relayState)}">` : ''}
<p>Returning to Ingotrace…</p><noscript><button type="submit">Continue</button></noscript></form>`,
    '<script>document.forms[0].submit()</script>',
  );
}

export function messagePage(title: string, message: string): string {
  return page(title, `<h1>${escapeHtml(title)}</h1><p>${escapeHtml(message)}</p>`);
}
