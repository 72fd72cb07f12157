import { mkdirSync } from 'node:fs'
import type { Page } from '@playwright/test'
import { expect, test } from './fixtures'
import { PEOPLE, signIn } from './helpers'
import { LARKSPUR } from '../demo-people'

// Issue 18, points 3 and 4: stable chart styles and the check table at 1440 and 390 px; a finding's cell link; the
// person's own unfinished uploads (resume, discard) and submissions.

async function screens(page: Page, name: string) {
  mkdirSync('test-results/screens', { recursive: true })
  for (const width of [1440, 390]) {
    await page.setViewportSize({ width, height: 900 })
    await page.screenshot({ path: `test-results/screens/${name}-${width}.png`, fullPage: true })
  }
  await page.setViewportSize({ width: 1366, height: 860 })
}

test('the bench draws every method in its own style in each chart, with the values as a table and checks readable', async ({ page }) => {
  await signIn(page, PEOPLE.actuary)
  const tables = await (await page.request.get(`/api/orgs/${LARKSPUR}/tables`)).json() as { id: string, name: string }[]
  const table = tables.find(t => t.name === 'Pensioner mortality, male')!
  const versions = await (await page.request.get(`/api/orgs/${LARKSPUR}/tables/${table.id}/versions`)).json() as { number: number }[]
  await page.goto(`/orgs/${LARKSPUR}/tables/${table.id}/versions/${versions[0]!.number}/bench`)
  await expect(page.getByTestId('check-zigzag')).toBeVisible({ timeout: 30_000 })
  // the explanation has its own row, below the verdicts
  await expect(page.getByTestId('check-why-zigzag')).toBeVisible()
  // the text alternative: the values chart's table names every method
  await page.getByTestId('chart-values-values').locator('summary').click()
  const values = page.getByTestId('chart-values-values').locator('table')
  await expect(values).toBeVisible()
  const methods = await page.getByTestId('check-zigzag').locator('td[data-method]').evaluateAll(tds => tds.map(td => td.getAttribute('data-method')))
  for (const m of methods) await expect(values.locator('thead')).toContainText(m!)
  await screens(page, 'bench-charts')
})

test('a finding\u2019s cell link shows the cell; the upload waits in My uploads until resumed or discarded', async ({ page }) => {
  await signIn(page, PEOPLE.analyst)
  await page.goto(`/orgs/${LARKSPUR}/imports/new`)
  await page.getByTestId('import-file').setInputFiles('public/demo/larkspur-pensioner-study-2026.csv')
  await page.waitForURL(/\/imports\/[0-9a-f-]{36}/)
  const wizard = new URL(page.url()).pathname
  const id = wizard.split('/').at(-1)!
  await expect(page.getByTestId('sheet-step')).toBeVisible()
  await page.getByTestId('to-columns').click()
  await expect(page.getByTestId('mapping-step')).toBeVisible()
  await page.getByTestId('to-check').click()
  await expect(page.getByTestId('findings')).toContainText('C17')
  await page.getByTestId('finding-go-C17').click()
  await expect(page.getByTestId('fix-C17')).toBeFocused()
  await expect(page.getByTestId('fix-C17')).toBeInViewport()
  await expect(page.locator('[data-cell="C17"]')).toHaveAttribute('data-shown', 'true')
  await screens(page, 'import-finding-link')

  // My work: the upload is listed with a way back and a way to discard it
  await page.getByTestId('nav-my-work').click()
  const mine = page.getByTestId(`my-upload-${id}`)
  await expect(mine).toContainText('larkspur-pensioner-study-2026.csv')
  await expect(page.getByTestId('my-submissions')).toBeVisible()
  await screens(page, 'my-work')
  await mine.getByTestId('my-upload-resume').click()
  await page.waitForURL(new RegExp(`${wizard}$`))
  await expect(page.getByTestId('sheet-step')).toBeVisible()
  await page.goto(`/orgs/${LARKSPUR}/imports/new`)
  await page.getByTestId(`my-upload-${id}`).getByTestId('my-upload-discard').click()
  await expect(page.getByTestId(`my-upload-${id}`)).toHaveCount(0)
})
