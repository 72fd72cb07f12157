import type { Page } from '@playwright/test'
import { expect, test } from './fixtures'
import { PEOPLE, signIn, useOwnAddress } from './helpers'

// Every main page, as the role that uses it, under the app's Content-Security-Policy. The fixture (fixtures.ts) fails a
// test on any violation the browser reports; here each page's own answer is also checked for the policy itself.
const ORG = 'larkspur-mutual'
const NO_SUCH_LINK = 'AAAAAAAAAAAAAAAAAAAAAA'

async function visit(page: Page, path: string, heading: string | RegExp) {
  const response = await page.goto(path)
  const csp = response?.headers()['content-security-policy'] ?? ''
  expect(csp, path).toContain("frame-ancestors 'none'")
  expect(csp, path).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]{16,}' 'strict-dynamic'/)
  expect(csp, path).not.toMatch(/unsafe-eval|script-src[^;]*unsafe-inline/)
  await expect(page.getByRole('heading', { level: 1, name: heading })).toBeVisible()
}

async function tableId(page: Page, name: string): Promise<string> {
  const tables = await (await page.request.get(`/api/orgs/${ORG}/tables`)).json() as { id: string, name: string }[]
  return tables.find(t => t.name === name)!.id
}

test('signed-out pages', async ({ page }) => {
  await useOwnAddress(page)
  await visit(page, '/signin', 'Sign in')
  await visit(page, '/signup', 'Create an organisation')
  await visit(page, '/forgot-password', 'Forgot your password?')
  await visit(page, `/confirm-signup/${NO_SUCH_LINK}`, 'Finish creating your account')
  await visit(page, `/reset-password/${NO_SUCH_LINK}`, 'Set a new password')
  await visit(page, `/invitations/${NO_SUCH_LINK}`, 'Invitation')
})

test('an actuary\u2019s pages: tables, a table, the bench with a comparison run, versions compared, second check, audit, account', async ({ page }) => {
  await signIn(page, PEOPLE.actuary)
  await visit(page, `/orgs/${ORG}`, 'Tables')
  const mortality = await tableId(page, 'Pensioner mortality, male')
  await visit(page, `/orgs/${ORG}/tables/${mortality}`, 'Pensioner mortality, male')
  const versions = await (await page.request.get(`/api/orgs/${ORG}/tables/${mortality}/versions`)).json() as { number: number, status: string }[]
  const draft = versions.find(v => v.status === 'draft')!
  await visit(page, `/orgs/${ORG}/tables/${mortality}/versions/${draft.number}/bench`, 'Fill bench')
  // the comparison runs on opening; its charts (ECharts on canvas, with tooltips) are drawn under the policy
  await expect.poll(async () => {
    const root = page.locator('[data-drawn-run]')
    return (await root.getAttribute('data-drawn-run')) === (await root.getAttribute('data-run'))
  }, { timeout: 30_000 }).toBe(true)
  await page.getByTestId('chart-values').locator('canvas').first().hover({ position: { x: 200, y: 120 } })
  await visit(page, `/orgs/${ORG}/tables/${mortality}/diff`, 'Compare versions')
  await visit(page, `/orgs/${ORG}/reviews`, 'Second check')
  await visit(page, `/orgs/${ORG}/audit`, 'Audit trail')
  await visit(page, '/account', 'Your account')
})

test('an analyst\u2019s import wizard', async ({ page }) => {
  await signIn(page, PEOPLE.analyst)
  await visit(page, `/orgs/${ORG}/imports/new`, 'Import a spreadsheet')
  await page.getByTestId('import-file').setInputFiles('public/demo/larkspur-pensioner-study-2026.csv')
  await page.waitForURL(/\/imports\/[0-9a-f-]{36}/)
  await expect(page.getByTestId('sheet-step')).toBeVisible()
  await page.getByTestId('to-columns').click()
  await expect(page.getByTestId('mapping-step')).toBeVisible()
  await page.reload() // the wizard's page as served, not only as reached
  await expect(page.getByTestId('sheet-step')).toBeVisible()
})

test('an administrator\u2019s members and billing; an auditor\u2019s check-a-file', async ({ page }) => {
  await signIn(page, PEOPLE.admin)
  await visit(page, `/orgs/${ORG}/members`, 'Members')
  await visit(page, `/orgs/${ORG}/billing`, 'Billing')
  await expect(page.getByTestId('card-on-file')).toBeVisible()
  await page.getByTestId('sign-out').click()
  await signIn(page, PEOPLE.auditor)
  await visit(page, `/orgs/${ORG}/verify`, 'Check a signed file')
  await visit(page, `/orgs/${ORG}/audit`, 'Audit trail')
})
