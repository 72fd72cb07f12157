import { randomBytes } from 'node:crypto'
import { expect, test } from './fixtures'
import { shot, useOwnAddress } from './helpers'

const INBOX = (process.env.KW_MAIL_INBOX_URL ?? '').replace(/\/+$/, '')

/** The sign-up link in the newest mail to an address, read over the fake inbox's HTTP API. */
async function signupLink(to: string): Promise<string> {
  for (let i = 0; i < 100; i++) {
    const list = await (await fetch(`${INBOX}/messages?${new URLSearchParams({ to, subject: 'Finish creating' })}`)).json() as { text: string }[]
    const m = list[0] && /(https?:\/\/\S+\/confirm-signup\/[A-Za-z0-9_-]+)/.exec(list[0].text)
    if (m) return m[1]!
    await new Promise(r => setTimeout(r, 100))
  }
  throw new Error(`no sign-up mail to ${to}`)
}

test('a new team signs up: the address first, then from the e-mailed link the organisation, name and password', async ({ page }) => {
  await useOwnAddress(page)
  const email = `founder-${randomBytes(4).toString('hex')}@example.test`
  await page.goto('/signup')
  await page.getByLabel('Work e-mail').fill(email)
  await page.getByRole('button', { name: 'Send me the link' }).click()
  await expect(page.getByRole('alert')).toContainText('We have sent a link to this address')
  await shot(page, 'signup-sent')

  await page.goto(await signupLink(email))
  await expect(page.getByTestId('signup-email')).toHaveText(email)
  await page.getByLabel('Organisation').fill(`Wrenfield Friendly Society ${email.slice(8, 12)}`)
  await page.getByLabel('Your name').fill('Ada Wren')
  await page.getByLabel('Choose a password').fill('a long enough passphrase')
  await shot(page, 'signup-details')
  await page.getByRole('button', { name: 'Create organisation' }).click()
  await page.waitForURL(/\/orgs\/wrenfield-friendly-society/)
  await expect(page.getByRole('heading', { level: 1, name: 'Tables' })).toBeVisible()
})

test('sign-in fields wait for the page to be ready: nothing typed is lost, no password goes into the address, the e-mail field gets the focus', async ({ page }) => {
  // the page as the server sends it, before any script runs: the form's fields are disabled, and it would post
  const served = await (await page.request.get('/signin')).text()
  expect(served).toMatch(/<form[^>]*method="post"[^>]*data-testid="signin-form"/)
  expect(served).toMatch(/<fieldset[^>]*disabled/)
  await page.goto('/signin')
  await expect(page.getByLabel('E-mail')).toBeFocused()
  await expect(page.getByLabel('E-mail')).toBeEnabled()
})
