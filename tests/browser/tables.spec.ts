import type { Page } from '@playwright/test'
import { expect, test } from './fixtures'
import { PEOPLE, shot, signIn } from './helpers'

const ORG = 'larkspur-mutual'

async function openTable(page: Page, name: string) {
  const tables = await (await page.request.get(`/api/orgs/${ORG}/tables`)).json() as { id: string, name: string }[]
  await page.goto(`/orgs/${ORG}/tables/${tables.find(t => t.name === name)!.id}`)
  await expect(page.getByRole('heading', { level: 1, name })).toBeVisible()
}

test('an analyst edits a table\'s details; an empty name is refused, and nothing changes until saved', async ({ page }) => {
  await signIn(page, PEOPLE.analyst)
  await openTable(page, 'Salary scale, staff scheme')
  await page.getByTestId('edit-details').click()
  const form = page.getByTestId('table-details-form')
  await expect(form.getByLabel('Kind')).toBeEnabled()
  await form.getByLabel('Name').fill('')
  await form.getByTestId('table-details-save').click()
  await expect(form.getByText('Enter a name')).toBeVisible()
  await form.getByLabel('Name').fill('Salary scale, staff scheme')
  await form.getByLabel('Description').fill('Salary index by age (age 20 = 1), promotional scale plus general increases. Invented for the demo.')
  await form.getByLabel('Tags').fill('salary, staff scheme, 2026 basis')
  await shot(page, 'table-details-form')
  await form.getByTestId('table-details-save').click()
  await expect(form).toBeHidden()
  await expect(page.locator('.pill', { hasText: '2026 basis' })).toBeVisible()
  await expect(page.getByText('promotional scale plus general increases')).toBeVisible()
})

test('once a version is signed off, the kind and units of its table are fixed', async ({ page }) => {
  await signIn(page, PEOPLE.analyst)
  await openTable(page, 'Pensioner mortality, female')
  await page.getByTestId('edit-details').click()
  const form = page.getByTestId('table-details-form')
  await expect(form.getByLabel('Kind')).toBeDisabled()
  await expect(form.getByLabel('Values in')).toBeDisabled()
  await expect(form.getByTestId('meaning-fixed')).toContainText('fixed')
  await form.getByLabel('Name').press('Escape')
  await expect(form).toBeHidden()
})

test('an auditor sees no way to edit a table', async ({ page }) => {
  await signIn(page, PEOPLE.auditor)
  await openTable(page, 'Pensioner mortality, female')
  await expect(page.getByTestId('edit-details')).toHaveCount(0)
})
