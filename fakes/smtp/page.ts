import type { StoredMessage } from './inbox.ts'

export function esc(v: unknown): string {
  return String(v ?? '').replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!)
}

/** Escapes text and turns http(s) URLs into links. */
export function linkify(text: string): string {
  return text.split(/(https?:\/\/[^\s<>"']+)/g).map((part, i) => (i % 2 ? `<a href="${esc(part)}" target="_blank" rel="noopener">${esc(part)}</a>` : esc(part))).join('')
}

export function inboxPage(messages: StoredMessage[], selected?: StoredMessage): string {
  const rows = messages.map((m) => `<li${m.id === selected?.id ? ' class="sel"' : ''}><a href="/?id=${esc(m.id)}"><strong>${esc(m.subject || '(no subject)')}</strong><br><small>${esc(m.to.join(', '))} · ${esc(m.date)}</small></a></li>`).join('')
  const view = selected
    ? `<h2>${esc(selected.subject)}</h2><p><small>From ${esc(selected.from)}<br>To ${esc([...selected.to, ...selected.cc].join(', '))}<br>${esc(selected.date)}</small></p>
${selected.html ? `<iframe title="HTML body" src="/messages/${esc(selected.id)}/html" sandbox="allow-popups allow-popups-to-escape-sandbox allow-top-navigation-by-user-activation"></iframe><h3>Text</h3>` : ''}
<pre>${linkify(selected.text)}</pre>`
    : '<p>Select a message.</p>'
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Local mail inbox</title><style>
body{font:14px/1.45 system-ui,sans-serif;margin:0;display:flex;min-height:100vh;color:#222}
nav{width:22rem;border-right:1px solid #ddd;overflow:auto}nav ul{list-style:none;margin:0;padding:0}
nav li a{display:block;padding:.6rem .8rem;border-bottom:1px solid #eee;color:inherit;text-decoration:none}nav li.sel a{background:#eef}
section{flex:1;padding:1rem 1.5rem;overflow:auto}pre{white-space:pre-wrap;background:#f7f7f7;padding:.75rem}
iframe{width:100%;height:28rem;border:1px solid #ddd}header{padding:.6rem .8rem;border-bottom:1px solid #ddd}
</style></head><body><nav><header><strong>Local mail inbox</strong> (${messages.length})
<form method="post" action="/clear" style="display:inline"><button>Clear</button></form></header><ul>${rows}</ul></nav><section>${view}</section></body></html>`
}
