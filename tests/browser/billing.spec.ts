import { randomBytes } from 'node:crypto'
import { expect, test } from './fixtures'
import { PEOPLE, shot, signIn, useOwnAddress } from './helpers'

const INBOX = (process.env.KW_MAIL_INBOX_URL ?? '').replace(/\/+$/, '')

/** The invitation link in the newest mail to an address, read over the fake inbox's HTTP API. */
async function invitationLink(to: string): Promise<string> {
  for (let i = 0; i < 100; i++) {
    const list = await (await fetch(`${INBOX}/messages?${new URLSearchParams({ to, subject: 'Join' })}`)).json() as { text: string }[]
    const m = list[0] && /(https?:\/\/\S+\/invitations\/[A-Za-z0-9_-]+)/.exec(list[0].text)
    if (m) return m[1]!
    await new Promise(r => setTimeout(r, 100))
  }
  throw new Error(`no invitation mail to ${to}`)
}

test('the admin raises seats from 5 to 8, sees the proration invoice, invites an auditor who joins from the e-mail', async ({ page, browser }) => {
  await signIn(page, PEOPLE.admin)
  await page.getByTestId('nav-billing').click()
  await expect(page.getByRole('heading', { name: 'Billing' })).toBeVisible()
  await expect(page.getByTestId('billing-seats-purchased')).toHaveText('5')
  await expect(page.getByTestId('card-on-file')).toContainText('4242')
  await expect(page.getByTestId('invoice-subscription_create')).toBeVisible()
  await shot(page, 'billing-before')

  await page.getByLabel('Seats', { exact: true }).fill('8')
  await page.getByTestId('seats-submit').click()
  // nothing is charged before the admin has read what it will cost (the payment service's preview)
  const confirm = page.getByTestId('confirm-seats')
  await expect(confirm).toBeVisible()
  await expect(confirm).toContainText('Change seats from 5 to 8?')
  const charge = (await confirm.getByTestId('seats-charge').textContent()) ?? ''
  expect(charge).toMatch(/€[\d,.]+ will be charged now to Visa •••• 4242/)
  await expect(confirm).toContainText('a month for 8 seats')
  await shot(page, 'billing-confirm-seats')
  await expect(page.getByTestId('billing-seats-purchased')).toHaveText('5')
  await confirm.getByTestId('confirm-seats-confirm').click()
  await expect(page.getByTestId('billing-seats-purchased')).toHaveText('8')
  const proration = page.getByTestId('invoice-subscription_update')
  await expect(proration).toBeVisible()
  await expect(proration).toContainText('Seat change')
  await expect(proration).toContainText('Paid')
  await expect(proration).toContainText(/€[\d,.]+/.exec(charge)![0]) // the invoice is the amount the admin confirmed
  await shot(page, 'billing-after-seats')

  const email = `auditor-${randomBytes(4).toString('hex')}@larkspur.example`
  await page.getByTestId('nav-members').click()
  await expect(page.getByTestId('seats-purchased')).toHaveText('8')
  const form = page.getByTestId('invite-form')
  await form.getByLabel('E-mail').fill(email)
  await form.getByLabel('Role', { exact: true }).selectOption('auditor')
  await page.getByTestId('invite-submit').click()
  await expect(page.getByText(`Invitation sent to ${email}.`)).toBeVisible()
  await expect(page.getByTestId(`invitation-${email}`)).toContainText('Auditor')
  await expect(page.getByTestId('seats-used')).toHaveText('6')
  await shot(page, 'members-invited')

  // the invitee, in a browser of their own, follows the link from the e-mail
  const link = await invitationLink(email)
  const invitee = await (await browser.newContext()).newPage()
  await useOwnAddress(invitee)
  await invitee.goto(link)
  await expect(invitee.getByRole('heading', { name: 'Join Larkspur Mutual' })).toBeVisible()
  await expect(invitee.getByTestId('invited-role')).toHaveText('Auditor')
  await invitee.getByLabel('Your name').fill('Iris Auditor')
  await invitee.getByLabel('Choose a password').fill('an auditor passphrase')
  await shot(invitee, 'invitation-accept')
  await invitee.getByTestId('accept-submit').click()
  await invitee.waitForURL(/\/orgs\/larkspur-mutual/)
  await expect(invitee.getByTestId('current-role')).toHaveText('Auditor')
  await invitee.getByTestId('sign-out').click()
  await invitee.waitForURL(/\/signin/)

  // and signs in with the new account
  await signIn(invitee, email, 'an auditor passphrase')
  await expect(invitee.getByTestId('current-role')).toHaveText('Auditor')
  await expect(invitee.getByTestId('nav-billing')).toHaveCount(0)
  await shot(invitee, 'auditor-signed-in')

  await page.reload()
  await expect(page.getByTestId(`member-${email}`)).toBeVisible()
  await shot(page, 'members-after-accept')
})

test('the admin creates a read token limited to one table, sees it once, and revokes it', async ({ page }) => {
  await signIn(page, PEOPLE.admin)
  await page.goto('/orgs/larkspur-mutual/members')
  const panel = page.getByTestId('read-tokens')
  await panel.getByTestId('read-token-create').click()
  await expect(panel.getByText('Name the token after the system')).toBeVisible()
  await panel.getByLabel('System').fill('Pricing model (browser test)')
  // limited to one table: none ticked is refused, the curve ticked is what the system then sees
  await panel.getByTestId('read-token-scope-some').check()
  await panel.getByTestId('read-token-create').click()
  await expect(panel.getByText('Pick at least one table')).toBeVisible()
  await panel.getByTestId('read-token-tables').getByLabel('Discount curve 2026-09-30').check()
  await shot(page, 'read-token-scope')
  await panel.getByTestId('read-token-create').click()
  const value = await panel.getByTestId('read-token-value').textContent()
  expect(value).toMatch(/^kwr_/)
  await expect(panel.locator('tr[data-token-name="Pricing model (browser test)"]').getByTestId('read-token-reads')).toHaveText('Discount curve 2026-09-30')
  const list = await page.request.get('/api/v1/tables', { headers: { authorization: `Bearer ${value}` } })
  expect(list.status()).toBe(200)
  expect((await list.json() as { name: string }[]).map(t => t.name)).toEqual(['Discount curve 2026-09-30'])
  await shot(page, 'read-token-created')
  await panel.getByTestId('read-token-revoke-Pricing model (browser test)').click()
  await panel.getByTestId('read-token-revoke-confirm-Pricing model (browser test)').click()
  await expect(panel.locator('tr[data-token-name="Pricing model (browser test)"]')).toContainText('revoked')
  await expect(panel.getByTestId('read-token-fresh')).toHaveCount(0)
  expect((await page.request.get('/api/v1/tables', { headers: { authorization: `Bearer ${value}` } })).status()).toBe(401)
})
