import type { Address, StoredEmail } from './store';

/*
 * Two plain pages for people running the demo: the list of what the shop sent, and one message. Every
 * value from a message is escaped; the message's own HTML is shown in an iframe with an empty sandbox,
 * so its scripts, forms and links cannot run or reach this page.
 */

export function escapeHtml(value: string): string {
  return value
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

const STYLE = `
  :root { color-scheme: light; --ink: #1f1d1a; --muted: #6b655c; --line: #ddd6cb; --ground: #faf7f2; --accent: #8a4b2a; }
  * { box-sizing: border-box; }
  body { margin: 0; background: var(--ground); color: var(--ink); font: 15px/1.5 system-ui, sans-serif; }
  main { max-width: 60rem; margin: 0 auto; padding: 1.5rem 1rem 3rem; }
  h1 { font-size: 1.35rem; margin: 0 0 .25rem; }
  h2 { font-size: 1.05rem; margin: 1.75rem 0 .5rem; }
  p.note { color: var(--muted); margin: 0 0 1.25rem; }
  a { color: var(--accent); }
  a:focus-visible { outline: 2px solid var(--accent); outline-offset: 2px; }
  table { width: 100%; border-collapse: collapse; background: #fff; border: 1px solid var(--line); }
  th, td { text-align: left; padding: .5rem .65rem; border-bottom: 1px solid var(--line); vertical-align: top; overflow-wrap: anywhere; }
  th { font-size: .8rem; text-transform: uppercase; letter-spacing: .04em; color: var(--muted); font-weight: 600; }
  td.time { white-space: nowrap; font-variant-numeric: tabular-nums; color: var(--muted); }
  .empty { background: #fff; border: 1px dashed var(--line); padding: 2rem 1rem; text-align: center; color: var(--muted); }
  dl { display: grid; grid-template-columns: max-content 1fr; gap: .25rem 1rem; margin: 0; }
  dt { color: var(--muted); }
  dd { margin: 0; overflow-wrap: anywhere; }
  pre { white-space: pre-wrap; overflow-wrap: anywhere; background: #fff; border: 1px solid var(--line); padding: .75rem; margin: 0; font: 14px/1.5 ui-monospace, monospace; }
  iframe { width: 100%; min-height: 28rem; border: 1px solid var(--line); background: #fff; }
  .tag { display: inline-block; font-size: .75rem; border: 1px solid var(--line); border-radius: 999px; padding: 0 .5rem; color: var(--muted); }
  @media (max-width: 40rem) { thead { display: none; } tr, td { display: block; } td { border: 0; padding: .15rem .65rem; } tr { border-bottom: 1px solid var(--line); padding: .4rem 0; } }
`;

function layout(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<style>${STYLE}</style>
</head>
<body><main>${body}</main></body>
</html>`;
}

function addresses(list: Address[]): string {
  if (list.length === 0) return '—';
  return list.map((a) => escapeHtml(a.name ? `${a.name} <${a.address}>` : a.address)).join(', ');
}

/** UTC, so every reader of the demo sees the same time whatever their machine's zone. */
function time(iso: string): string {
  return `${iso.slice(0, 10)} ${iso.slice(11, 19)} UTC`;
}

export function inboxPage(messages: StoredEmail[], total: number): string {
  const rows = messages
    .map(
      (m) => `<tr>
  <td>${addresses(m.from)}</td>
  <td>${addresses(m.to.length ? m.to : m.envelope.to.map((address) => ({ address, name: '' })))}</td>
  <td><a href="/email/${encodeURIComponent(m.id)}">${escapeHtml(m.subject || '(no subject)')}</a>${m.duplicate ? ' <span class="tag">repeated Message-ID</span>' : ''}</td>
  <td class="time"><time datetime="${escapeHtml(m.receivedAt)}">${time(m.receivedAt)}</time></td>
</tr>`,
    )
    .join('\n');
  const shown = messages.length < total ? ` The newest ${messages.length} are shown.` : '';
  const body = messages.length
    ? `<table>
<thead><tr><th scope="col">From</th><th scope="col">To</th><th scope="col">Subject</th><th scope="col">Received</th></tr></thead>
<tbody>
${rows}
</tbody>
</table>`
    : `<div class="empty">Nothing has been sent yet. E-mails the shop sends during the demo appear here.</div>`;
  return layout(
    'Sent mail — Demold',
    `<h1>Sent mail</h1>
<p class="note">Every e-mail the shop sent to this local test mail server, newest first. ${total} kept in memory; nothing leaves this machine.${shown} Reload to see new ones.</p>
${body}`,
  );
}

export function messagePage(m: StoredEmail): string {
  const headers = Object.entries(m.headers)
    .map(([name, value]) => `<dt>${escapeHtml(name)}</dt><dd>${escapeHtml(value)}</dd>`)
    .join('\n');
  const html = m.html
    ? `<h2>HTML version</h2>
<iframe sandbox="" srcdoc="${escapeHtml(m.html)}" title="HTML version of the message"></iframe>`
    : `<h2>HTML version</h2><p class="note">This message has no HTML version.</p>`;
  const attachments = m.attachments.length
    ? `<h2>Attachments</h2><ul>${m.attachments
        .map((a) => `<li>${escapeHtml(a.filename ?? '(unnamed)')} — ${escapeHtml(a.contentType)}, ${a.size} bytes</li>`)
        .join('')}</ul>`
    : '';
  return layout(
    `${m.subject || '(no subject)'} — Demold sent mail`,
    `<p><a href="/">← All sent mail</a></p>
<h1>${escapeHtml(m.subject || '(no subject)')}</h1>
<dl>
<dt>From</dt><dd>${addresses(m.from)}</dd>
<dt>To</dt><dd>${addresses(m.to)}</dd>
${m.cc.length ? `<dt>Cc</dt><dd>${addresses(m.cc)}</dd>` : ''}
<dt>Envelope</dt><dd>${escapeHtml(m.envelope.from || '(null sender)')} → ${escapeHtml(m.envelope.to.join(', '))}</dd>
<dt>Received</dt><dd><time datetime="${escapeHtml(m.receivedAt)}">${time(m.receivedAt)}</time></dd>
</dl>
<h2>Plain text</h2>
${m.text ? `<pre>${escapeHtml(m.text)}</pre>` : '<p class="note">This message has no plain-text version.</p>'}
${html}
${attachments}
<h2>Headers</h2>
<dl>
${headers}
</dl>
<p class="note">Raw JSON: <a href="/api/email/${encodeURIComponent(m.id)}">/api/email/${escapeHtml(m.id)}</a></p>`,
  );
}

export function notFoundPage(): string {
  return layout(
    'Not found — Demold sent mail',
    `<h1>No such message</h1><p class="note">It may have been cleared, or the server restarted since.</p><p><a href="/">← All sent mail</a></p>`,
  );
}
