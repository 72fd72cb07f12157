import type { Page } from '@playwright/test'
import { expect, test } from './fixtures'
import { PEOPLE, shot, signIn } from './helpers'

// Engine II in the product: methods offered by applicability, the old-age closure with its options in words, and the
// graduate step (fit tests before a new draft is made).
const ORG = 'larkspur-mutual'

async function tableId(page: Page, name: string): Promise<string> {
  const tables = await (await page.request.get(`/api/orgs/${ORG}/tables`)).json() as { id: string, name: string }[]
  return tables.find(t => t.name === name)!.id
}
async function latest(page: Page, id: string, status?: string): Promise<number> {
  const versions = await (await page.request.get(`/api/orgs/${ORG}/tables/${id}/versions`)).json() as { number: number, status: string }[]
  return versions.find(v => !status || v.status === status)!.number
}
async function waitForRun(page: Page) {
  await expect(page.getByTestId('bench-compare')).toBeEnabled({ timeout: 30_000 })
  await expect.poll(async () => {
    const root = page.locator('[data-drawn-run]')
    return (await root.getAttribute('data-drawn-run')) === (await root.getAttribute('data-run'))
  }, { timeout: 30_000 }).toBe(true)
}
const addOptions = (page: Page) => page.locator('#bench-add option').allTextContents()

test('a curve at standard tenors is not offered the osculatory methods nor an old-age closure, and says why', async ({ page }) => {
  await signIn(page, PEOPLE.actuary)
  const id = await tableId(page, 'Discount curve 2026-09-30')
  await page.goto(`/orgs/${ORG}/tables/${id}/versions/${await latest(page, id)}/bench`)
  await waitForRun(page)
  const offered = await addOptions(page)
  expect(offered).toContain('Monotone cubic (PCHIP)')
  expect(offered.some(o => /Sprague|Beers|Karup/.test(o))).toBe(false)
  await expect(page.getByTestId('bench-not-offered')).toContainText('Sprague osculatory (needs equally spaced given points (these are not))')
  const rules = await page.getByTestId('bench-extrapolation').locator('option').allTextContents()
  expect(rules.some(r => /Gompertz|Kannisto/.test(r))).toBe(false)
})

test('five-year mortality is offered Sprague, and a Gompertz closure with its options in words, its fit shown', async ({ page }) => {
  await signIn(page, PEOPLE.actuary)
  const id = await tableId(page, 'Pensioner mortality, male')
  await page.goto(`/orgs/${ORG}/tables/${id}/versions/${await latest(page, id, 'draft')}/bench`)
  await waitForRun(page)
  expect(await addOptions(page)).toEqual(expect.arrayContaining(['Sprague osculatory', 'Beers ordinary six-term', 'Karup-King osculatory']))
  await page.locator('#bench-add').selectOption({ label: 'Sprague osculatory' })
  await page.getByRole('button', { name: 'Add', exact: true }).click()
  await page.getByTestId('bench-extrapolation').selectOption({ label: 'Close old ages with a fitted Gompertz law (mortality)' })
  const closure = page.getByTestId('closure-options')
  await expect(closure).toContainText('Terminal age')
  await expect(closure).toContainText('Fit the law from age')
  await expect(page.getByTestId('grid-to')).toHaveValue('120')
  await page.getByTestId('closure-fitFrom').fill('95')
  await page.getByTestId('bench-compare').click()
  await waitForRun(page)
  const report = page.getByTestId('bench-closure')
  await expect(report.locator('li[data-method="Sprague osculatory"]')).toContainText(/Gompertz law fitted to \d+ given ages from 95 to 1\d\d: it fits them/)
  await expect(report).toContainText('q reaches 1 at age 120')
  await shot(page, 'bench-closure-sprague')
})

test('an analyst graduates crude rates, reads the fit tests, and makes the graduation a new draft with reasons', async ({ page }) => {
  await signIn(page, PEOPLE.analyst)
  // crude rates of an invented study (test data), imported as their own table so the demo tables stay as they are
  const origin = new URL(page.url()).origin
  const csv = `age,q\n${Array.from({ length: 25 }, (_, i) => `${60 + i},${(0.004 * 1.1 ** i * (1 + [0.05, -0.04, 0.02, -0.05, 0.03][i % 5]!)).toPrecision(5)}`).join('\n')}\n`
  const up = await page.request.post(`/api/orgs/${ORG}/imports`, { headers: { origin }, multipart: { file: { name: 'study.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) } } })
  expect(up.status()).toBe(201)
  const name = `Zz crude study ${Date.now()}`
  const mapping = { sheet: 'study', headerRow: 0, axisColumn: 0, axis: 'age', axisUnit: 'years', columns: [{ index: 1, name, kind: 'mortality', valueUnit: 'per-unit' }] }
  const done = await page.request.post(`/api/orgs/${ORG}/imports/${(await up.json()).id}/commit`, { headers: { origin }, data: { mapping } })
  expect(done.status()).toBe(201)
  const id = (await done.json()).tables[0].id as string
  await page.goto(`/orgs/${ORG}/tables/${id}`)
  await page.getByTestId('open-graduate').click()
  await expect(page.getByRole('heading', { name: 'Graduate crude values' })).toBeVisible()
  await expect(page.getByTestId('graduate-caution')).toContainText('qualified actuary')
  await expect(page.getByTestId('graduate-test-signs')).toContainText(/\d+ above, \d+ below/)
  await expect(page.getByTestId('graduate-test-chi-square')).toContainText('Needs deaths and exposures')
  await page.getByTestId('graduate-order').selectOption({ label: 'Order 2: penalise bends (pulls toward a straight line)' })
  await page.getByTestId('graduate-smoothing').fill('50')
  await page.getByTestId('graduate-run').click()
  await expect(page.getByTestId('graduate-weights')).toContainText('order 2, smoothing 50')
  await shot(page, 'graduate-preview')
  await page.getByTestId('graduate-rationale').fill('Order 2, smoothing 50: signs balanced, runs fine, smooth enough for pricing.')
  await page.getByTestId('graduate-make-draft').click()
  await page.waitForURL(/\?v=2$/)
  await expect(page.getByTestId('version-2')).toContainText('Graduated from version 1 (Whittaker-Henderson, order 2, smoothing 50).')
  await expect(page.getByTestId('version-1')).toContainText('Withdrawn')
  await shot(page, 'graduate-new-draft')
})

test('an analyst imports deaths by age band, is asked what the values are, and splits them keeping each band\u2019s total', async ({ page }) => {
  await signIn(page, PEOPLE.analyst)
  await page.getByTestId('nav-import').click()
  // half-open intervals, quoted because they hold a comma (RFC 4180)
  const csv = 'Age band,Deaths\n"[60, 65)",120\n"[65, 70)",180\n"[70, 75)",260\n"[75, 80)",390\n"[80, 85)",520\n'
  await page.getByTestId('import-file').setInputFiles({ name: 'deaths-by-band.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) })
  await page.waitForURL(/\/imports\/[0-9a-f-]{36}/)
  await page.getByTestId('to-columns').click()
  const name = `Zz deaths by age ${Date.now()}`
  await page.getByLabel('Table name for Deaths').fill(name)
  await page.getByLabel('Kind for Deaths').selectOption({ label: 'Other' })
  await page.getByLabel('Unit for Deaths').selectOption({ label: 'per unit' })
  await page.getByTestId('to-check').click()
  const bands = page.getByTestId('import-bands')
  await expect(bands).toContainText('5 bands from 60–64 to 80–84, each 5 years wide')
  await expect(page.getByTestId('create-drafts')).toBeDisabled()
  await page.getByTestId('bands-totals').check()
  await page.getByTestId('bands-split').selectOption({ label: 'Sprague (fifth differences; needs 4 or more bands)' })
  await page.getByTestId('bands-answer').click()
  await expect(page.getByTestId('bands-checks')).toContainText('Every band\u2019s total is kept'.replace('\u2019', "'"))
  await expect(page.getByTestId('error-count')).toHaveText('0 blocking')
  await shot(page, 'import-bands-split')
  await page.getByTestId('create-drafts').click()
  await expect(page.getByTestId('import-done')).toContainText(name)
})

test('an analyst imports crude rates with their exposures and deaths; the graduation is weighted by them and tested against expected deaths', async ({ page }) => {
  await signIn(page, PEOPLE.analyst)
  await page.getByTestId('nav-import').click()
  // an invented experience study (test data): exposures falling with age, deaths, crude q = deaths / exposure
  const rows = Array.from({ length: 20 }, (_, i) => {
    const exposure = 3000 - 100 * i
    const deaths = Math.round(exposure * 0.006 * 1.1 ** i * (1 + [0.06, -0.05, 0.02, -0.04][i % 4]!))
    return `${60 + i},${exposure},${deaths},${(deaths / exposure).toPrecision(6)}`
  })
  const csv = `Age,Exposure (years lived),Deaths,Crude q\n${rows.join('\n')}\n`
  await page.getByTestId('import-file').setInputFiles({ name: 'study-with-experience.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) })
  await page.waitForURL(/\/imports\/[0-9a-f-]{36}/)
  await page.getByTestId('to-columns').click()
  await expect(page.getByLabel('Use of column Exposure (years lived)')).toHaveValue('exposure')
  await expect(page.getByLabel('Use of column Deaths')).toHaveValue('deaths')
  const name = `Zz study with experience ${Date.now()}`
  await page.getByLabel('Table name for Crude q').fill(name)
  await page.getByLabel('Kind for Crude q').selectOption({ label: 'Mortality q_x' })
  await page.getByLabel('Unit for Crude q').selectOption({ label: 'per unit' })
  await page.getByTestId('to-check').click()
  await expect(page.getByTestId('experience-count')).toContainText('exposures on 20 rows, deaths on 20')
  await shot(page, 'import-experience')
  await page.getByTestId('create-drafts').click()
  await expect(page.getByTestId('import-done')).toContainText(name)
  await page.goto(`/orgs/${ORG}/tables/${await tableId(page, name)}`)
  await page.getByTestId('open-graduate').click()
  await expect(page.getByTestId('graduate-weights')).toContainText('the imported exposures, with deaths for the chi-square test')
  await expect(page.getByTestId('graduate-test-chi-square')).not.toContainText('Needs deaths and exposures')
  await page.getByTestId('graduate-exposure').selectOption('initial')
  await page.getByTestId('graduate-run').click()
  await expect(page.getByTestId('graduate-weights')).toContainText('the imported exposures')
  await shot(page, 'graduate-with-experience')
})

test('a curve states its compounding, and Smith-Wilson on the bench shows its calibrated alpha and convergence check in words', async ({ page }) => {
  await signIn(page, PEOPLE.actuary)
  const id = await tableId(page, 'Discount curve 2026-09-30')
  await page.goto(`/orgs/${ORG}/tables/${id}`)
  await expect(page.getByTestId('table-compounding')).toContainText('annual compounding')
  await page.goto(`/orgs/${ORG}/tables/${id}/versions/${await latest(page, id)}/bench`)
  await waitForRun(page)
  await expect(page.getByTestId('chart-forwards')).toContainText('Implied forward rates (annual compounding)')
  await page.locator('#bench-add').selectOption({ label: 'Smith-Wilson (to an ultimate forward rate)' })
  await page.getByRole('button', { name: 'Add', exact: true }).click()
  await expect(page.getByTestId('option-smith-wilson-ufr')).toHaveValue('0.035')
  // options whose default is a rule read as words, not as the engine's keywords
  await expect(page.getByTestId('option-smith-wilson-alpha-rule').locator('option:checked')).toHaveText('Calibrated (the smallest that converges)')
  await expect(page.getByTestId('option-smith-wilson-llp-rule').locator('option:checked')).toHaveText('The last given term')
  await page.getByTestId('bench-compare').click()
  await waitForRun(page)
  const c = page.getByTestId('bench-convergence').locator('li[data-method="Smith-Wilson (to an ultimate forward rate)"]')
  await expect(c).toContainText(/^Met ?Smith-Wilson \(to an ultimate forward rate\): Alpha 0\.\d+, calibrated: the smallest alpha of at least 0\.05/)
  await expect(c).toContainText('within the 1 bp allowed')
  await shot(page, 'bench-smith-wilson')
})
