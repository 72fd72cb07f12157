import type { Page } from '@playwright/test'
import { expect, test } from './fixtures'
import { PEOPLE, shot, signIn } from './helpers'

const ORG = 'larkspur-mutual'

/** The fill bench of a demo table's version (newest draft, or the given number). */
async function openBench(page: Page, tableName: string, status?: string) {
  const tables = await (await page.request.get(`/api/orgs/${ORG}/tables`)).json() as { id: string, name: string }[]
  const table = tables.find(t => t.name === tableName)!
  const versions = await (await page.request.get(`/api/orgs/${ORG}/tables/${table.id}/versions`)).json() as { number: number, status: string }[]
  const version = versions.find(v => !status || v.status === status)!
  await page.goto(`/orgs/${ORG}/tables/${table.id}/versions/${version.number}/bench`)
  await expect(page.getByRole('heading', { name: 'Fill bench' })).toBeVisible()
}

/** Waits until the run that was started has been answered and its values chart drawn. */
async function waitForRun(page: Page) {
  await expect(page.getByTestId('bench-compare')).toBeEnabled({ timeout: 30_000 })
  await expect.poll(async () => {
    const root = page.locator('[data-drawn-run]')
    return (await root.getAttribute('data-drawn-run')) === (await root.getAttribute('data-run'))
  }, { timeout: 30_000 }).toBe(true)
}

test('an actuary compares three methods, moves the quadratic condition, and chooses the natural cubic', async ({ page }) => {
  await signIn(page, PEOPLE.actuary)
  await openBench(page, 'Pensioner mortality, male', 'draft')
  await expect(page.getByTestId('bench-caution')).toContainText('qualified actuary')
  await waitForRun(page)
  const zig = page.getByTestId('check-zigzag')
  await expect(zig.locator('td[data-method="Quadratic spline"]')).toContainText('Bends one way throughout')
  await expect(zig.locator('td[data-method="Natural cubic spline"]')).toContainText('Bends one way throughout')
  const quadCol = page.getByTestId('bench-grid').locator('tr[data-x="57"] td[data-col="2"]')
  const before = await quadCol.textContent()
  await shot(page, 'bench-mortality')

  await page.getByTestId('option-quadratic-condition').selectOption('right-zero-curvature')
  await page.getByTestId('bench-compare').click()
  await waitForRun(page)
  const right = zig.locator('td[data-method="Quadratic spline · Straight last piece"]')
  await expect(right).toContainText(/5 changes, at 60, 65, 70/)
  await expect(quadCol).not.toHaveText(before ?? '')
  await shot(page, 'bench-quadratic-right')

  await page.getByTestId('chart-values-log').check()
  await page.getByTestId('choose-method').selectOption('Natural cubic spline')
  await page.getByTestId('choose-rationale').fill('Natural cubic passes through every point and bends one way; the right-end quadratic zig-zags from 60 to 80.')
  await page.getByTestId('choose-save').click()
  await expect(page.getByTestId('saved-fill')).toContainText('Chosen fill: Natural cubic spline')
  await expect(page.getByTestId('saved-rationale')).toContainText('right-end quadratic zig-zags')
  await shot(page, 'bench-saved')

  // the table page shows the chosen fill with its reasons
  await page.getByRole('navigation', { name: 'Breadcrumb' }).getByRole('link', { name: 'Pensioner mortality, male' }).click()
  await expect(page.getByTestId('saved-fill')).toContainText('Natural cubic spline')
  await expect(page.getByTestId('open-bench')).toBeVisible()
  await shot(page, 'table-with-fill')
  // back on the bench, the chosen fill's settings are where the comparison starts
  await page.getByTestId('open-bench').click()
  await waitForRun(page)
  await expect(page.getByTestId('saved-fill')).toContainText('Natural cubic spline')
  await shot(page, 'bench-reopened')
})

test('a signed-off curve can be compared, with forward rates, but takes no fill', async ({ page }) => {
  await signIn(page, PEOPLE.analyst)
  await openBench(page, 'Discount curve 2026-09-30')
  await waitForRun(page)
  await expect(page.getByTestId('chart-forwards')).toBeVisible()
  await expect(page.getByTestId('check-forwards')).toBeVisible()
  // the chosen fill (monotone cubic in the demo) is compared beside the usual three
  await expect(page.getByTestId('saved-fill')).toContainText('Chosen fill: Monotone cubic (PCHIP)')
  await expect(page.getByTestId('check-zigzag').locator('td[data-method="Monotone cubic (PCHIP)"]')).toBeVisible()
  await expect(page.getByTestId('bench-choose')).toContainText('takes no fill')
  await expect(page.getByTestId('bench-grid')).toContainText('358 rows')
  await shot(page, 'bench-curve')
})

test('a long comparison shows how many methods are filled, and can be cancelled', async ({ page }) => {
  await signIn(page, PEOPLE.actuary)
  await openBench(page, 'Pensioner mortality, male', 'draft')
  await waitForRun(page)
  // 45,834 points on ln q (one exp per point): several seconds for three methods, even on a fast machine
  await page.getByTestId('grid-step').fill('0.0012')
  await page.getByTestId('bench-transform').selectOption('log')
  await page.getByTestId('bench-compare').click()
  await expect(page.getByTestId('bench-run')).toContainText(/[0-2] of 3 methods filled/, { timeout: 15_000 })
  await expect(page.getByTestId('bench-progress-known')).toBeVisible()
  await page.screenshot({ path: 'tests/browser/screenshots/bench-progress.png' }) // the visible part only: quick, the run goes on
  await page.getByTestId('bench-cancel').click()
  await expect(page.getByText('Comparison cancelled')).toBeVisible()
  await expect(page.getByTestId('bench-compare')).toBeEnabled()
})
