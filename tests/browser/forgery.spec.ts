import http from 'node:http'
import type { AddressInfo } from 'node:net'
import type { Page } from '@playwright/test'
import { expect, test } from './fixtures'
import { PEOPLE, signIn } from './helpers'

// The probe from the security review, in a real browser: while an administrator is signed in, a page served from
// another port of the same host (same site, so the browser sends the Lax session cookie along) makes the browser post
// to the app. Every attempt is refused, nothing is made, and the administrator stays signed in.
const ORG = 'larkspur-mutual'

/** Serves one HTML page on a free port of 127.0.0.1 (another origin, same site as the app). */
async function attackerPage(html: string): Promise<{ url: string; close: () => Promise<void> }> {
  const server = http.createServer((_, res) => { res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' }); res.end(html) })
  await new Promise<void>(resolve => server.listen(0, '127.0.0.1', resolve))
  return { url: `http://127.0.0.1:${(server.address() as AddressInfo).port}/`, close: () => new Promise(resolve => server.close(() => resolve())) }
}

async function invitationsOf(page: Page): Promise<string[]> {
  const list = await (await page.request.get(`/api/orgs/${ORG}/invitations`)).json() as { email: string }[]
  return list.map(i => i.email)
}

test('forms and fetches from another port of this host cannot change anything for a signed-in administrator', async ({ page }) => {
  await signIn(page, PEOPLE.admin)
  const app = new URL(page.url()).origin
  const cookieBefore = (await page.context().cookies(app)).find(c => c.name.endsWith('knotwork-session'))?.value
  expect(cookieBefore).toBeTruthy()
  const target = `${app}/api/orgs/${ORG}/invitations`
  const stamp = Date.now()
  const attempts = [
    // a plain form, submitted as the page loads
    `<form method="POST" action="${target}"><input name="email" value="forged-form-${stamp}@forms.example"><input name="role" value="admin"></form>
     <script>document.forms[0].submit()</script>`,
    // the text/plain trick that makes a form body read as JSON
    `<form method="POST" enctype="text/plain" action="${target}"><input name='{"email":"forged-text-${stamp}@forms.example","role":"admin","x":"' value='"}'></form>
     <script>document.forms[0].submit()</script>`,
    // a script's no-cors fetch with the cookie, JSON text in a body any page may send
    `<script>fetch(${JSON.stringify(target)}, { method: 'POST', mode: 'no-cors', credentials: 'include', body: JSON.stringify({ email: 'forged-fetch-${stamp}@forms.example', role: 'admin' }) })</script>`,
  ]
  for (const html of attempts) {
    const attacker = await attackerPage(`<!doctype html><html><body>${html}</body></html>`)
    try {
      const sent = page.waitForRequest(r => r.url() === target && r.method() === 'POST')
      await page.goto(attacker.url)
      // null when the browser itself withholds the answer from the other origin (the fetch: Cross-Origin-Resource-Policy)
      const res = await (await sent).response()
      if (res) {
        expect(res.status()).toBe(403)
        expect(res.headers()['set-cookie']).toBeUndefined()
      }
    } finally {
      await attacker.close()
    }
  }
  // nothing was made, and the session is the one the administrator had
  await page.goto(`/orgs/${ORG}/members`)
  await expect(page.getByRole('heading', { level: 1, name: 'Members' })).toBeVisible()
  expect((await invitationsOf(page)).filter(e => e.includes(String(stamp)))).toEqual([])
  expect((await page.context().cookies(app)).find(c => c.name.endsWith('knotwork-session'))?.value).toBe(cookieBefore)
})

test('no other site may frame the app', async ({ page }) => {
  await signIn(page, PEOPLE.admin)
  const app = new URL(page.url()).origin
  const attacker = await attackerPage(`<!doctype html><iframe id="f" src="${app}/orgs/${ORG}/members" width="600" height="400"></iframe>`)
  try {
    const refused = page.waitForEvent('console', m => /frame-ancestors|Refused to (display|frame)/i.test(m.text()))
    await page.goto(attacker.url)
    await refused
    // the frame shows no page of ours: its document is not reachable and holds no app content
    const frame = page.frames().find(f => f !== page.mainFrame())
    expect(await frame?.locator('h1', { hasText: 'Members' }).count() ?? 0).toBe(0)
  } finally {
    await attacker.close()
  }
})
