export function esc(v: unknown): string {
  return String(v ?? '').replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!)
}

/** A plain, neutral page standing in for a hosted payment page. */
export function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">
<title>${esc(title)}</title><style>
body{font:15px/1.5 system-ui,sans-serif;color:#222;background:#f4f4f4;margin:0;padding:2rem 1rem}
main{max-width:28rem;margin:0 auto;background:#fff;border:1px solid #ddd;border-radius:6px;padding:1.5rem}
h1{font-size:1.15rem;margin:0 0 1rem}label{display:block;margin:.75rem 0 .25rem;font-size:.9rem}
input{width:100%;box-sizing:border-box;padding:.5rem;border:1px solid #bbb;border-radius:4px;font:inherit}
.row{display:flex;gap:.75rem}.row>div{flex:1}button{margin-top:1rem;padding:.55rem 1.1rem;font:inherit;border:1px solid #333;background:#333;color:#fff;border-radius:4px;cursor:pointer}
.err{color:#a00;background:#fbeaea;padding:.5rem;border-radius:4px}.ok{color:#060;background:#eaf6ea;padding:.5rem;border-radius:4px}
.note{color:#666;font-size:.8rem;margin-top:1.25rem}table{width:100%;border-collapse:collapse;font-size:.9rem}td{padding:.3rem 0;border-bottom:1px solid #eee}td.n{text-align:right}
</style></head><body><main>${body}<p class="note">Local test payment page (no real payment is made).</p></main></body></html>`
}
