import { expect, test } from './fixtures'
import { PASSWORD, PEOPLE, shot, signIn, useOwnAddress } from './helpers'

test('the sign-in page explains itself and shows the caution', async ({ page }) => {
  await useOwnAddress(page)
  await page.goto('/')
  await expect(page).toHaveURL(/\/signin/)
  await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible()
  await expect(page.getByRole('note')).toContainText('qualified actuary')
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page.getByText('Enter an e-mail address')).toBeVisible()
  await shot(page, 'signin')
})

test('a wrong password gets a plain message and no session', async ({ page }) => {
  await useOwnAddress(page)
  await page.goto('/signin')
  await page.getByLabel('E-mail').fill(PEOPLE.analyst)
  await page.getByLabel('Password').fill('not the password')
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page.getByRole('alert')).toContainText('do not match')
  await expect(page).toHaveURL(/\/signin/)
})

// Navigation by role, from the permission table of docs/domain.md#permissions
const NAV: Record<'admin' | 'actuary' | 'analyst' | 'auditor', { shows: string[]; hides: string[] }> = {
  admin: { shows: ['nav-tables', 'nav-audit', 'nav-verify', 'nav-members', 'nav-billing'], hides: ['nav-reviews', 'nav-import'] },
  actuary: { shows: ['nav-tables', 'nav-reviews', 'nav-audit', 'nav-verify', 'nav-import'], hides: ['nav-members', 'nav-billing'] },
  analyst: { shows: ['nav-tables', 'nav-audit', 'nav-import'], hides: ['nav-reviews', 'nav-verify', 'nav-members', 'nav-billing'] },
  auditor: { shows: ['nav-tables', 'nav-audit', 'nav-verify'], hides: ['nav-reviews', 'nav-import', 'nav-members', 'nav-billing'] },
}

for (const role of ['admin', 'actuary', 'analyst', 'auditor'] as const) {
  test(`${role}: sees the navigation of the role, then signs out`, async ({ page }) => {
    await signIn(page, PEOPLE[role])
    await expect(page).toHaveURL(/\/orgs\/larkspur-mutual/)
    await expect(page.getByRole('heading', { name: 'Tables', exact: true })).toBeVisible()
    for (const id of NAV[role].shows) await expect(page.getByTestId(id)).toBeVisible()
    for (const id of NAV[role].hides) await expect(page.getByTestId(id)).toHaveCount(0)
    await expect(page.getByRole('note')).toContainText('qualified actuary')
    await shot(page, `home-${role}`)
    await page.getByTestId('sign-out').click()
    await expect(page).toHaveURL(/\/signin/)
    await page.goto('/orgs/larkspur-mutual')
    await expect(page).toHaveURL(/\/signin/)
  })
}

test('a role without the permission cannot open the members page by URL', async ({ page }) => {
  await signIn(page, PEOPLE.analyst)
  const response = await page.goto('/orgs/larkspur-mutual/members')
  expect(response?.status()).toBe(403)
  await expect(page.getByText('Not open to your role')).toBeVisible()
})

test('a person in two organisations switches between them', async ({ page }) => {
  await signIn(page, PEOPLE.both)
  const switcher = page.getByTestId('org-switcher')
  await expect(switcher).toBeVisible()
  await switcher.selectOption('fenwick-rowe')
  await expect(page).toHaveURL(/\/orgs\/fenwick-rowe/)
  await expect(page.getByText('Basis tables of Fenwick & Rowe Consulting')).toBeVisible()
  await shot(page, 'home-switched')
  await switcher.selectOption('larkspur-mutual')
  await expect(page).toHaveURL(/\/orgs\/larkspur-mutual/)
})

test('another organisation answers 404', async ({ page }) => {
  await signIn(page, PEOPLE.admin)
  const response = await page.goto('/orgs/fenwick-rowe')
  expect(response?.status()).toBe(404)
})

test('a session ended elsewhere sends the person to sign in, and back to the page after', async ({ page }) => {
  await signIn(page, PEOPLE.auditor)
  await page.goto('/account')
  await expect(page.getByRole('heading', { name: 'Your account' })).toBeVisible()
  // The session ends on the server (signed out in another tab) while this page keeps the old cookie
  const cookies = await page.context().cookies()
  const ended = await page.request.post('/api/auth/logout', { headers: { origin: new URL(page.url()).origin } })
  expect(ended.status()).toBe(200)
  await page.context().addCookies(cookies)
  // A wrong current password: with a live session this would stay here with "does not match"
  await page.getByLabel('Current password').fill('not the current password')
  await page.getByLabel('New password').fill('a-new-password-of-length')
  await page.getByRole('button', { name: 'Change password' }).click()
  await page.waitForURL(/\/signin\?/)
  expect(new URL(page.url()).searchParams.get('next')).toBe('/account')
  await page.getByLabel('E-mail').fill(PEOPLE.auditor)
  await page.getByLabel('Password').fill(PASSWORD)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page).toHaveURL(/\/account$/)
  await expect(page.getByRole('heading', { name: 'Your account' })).toBeVisible()
})
