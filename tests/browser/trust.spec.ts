import { randomBytes } from 'node:crypto'
import { readFile } from 'node:fs/promises'
import { QueryTypes } from 'sequelize'
import { parse } from 'csv-parse/sync'
import ExcelJS from 'exceljs'
import { expect, test, type Page } from '@playwright/test'
import { PEOPLE, shot, signIn } from './helpers'
import { closeOwnerDb, ownerDb } from '../api/helpers'
import { userId } from '../api/review-helpers'
import { checkAuditCsv } from '../../scripts/verify-audit-csv'

// Issue 11 in the browser: a stale fill blocks Submit with a reason until the fill is chosen again; the table page shows
// the fill's values in the table's unit beside the given points and hands out unsigned copies; sign-off and withdrawal
// ask first, with the consequences and the caution; the audit trail reads as sentences, filters by days in the app's
// format, exports CSV a script re-checks, and checks a head you hold.
const ORG = 'larkspur-mutual'
const NAME = `Browser q_x ${randomBytes(3).toString('hex')}`
let tableId = ''
test.describe.configure({ mode: 'serial' })

test.beforeAll(async () => {
  // a mortality draft in per mille, made behind the app's back: five given points, no fill yet
  const [t] = await ownerDb().query<{ id: string }>(`INSERT INTO rate_tables (org_id, name, kind, axis, value_unit, created_by)
    SELECT id, :name, 'mortality', 'age', 'per-mille', :author FROM organisations WHERE slug = :slug RETURNING id`, { replacements: { name: NAME, slug: ORG, author: await userId(PEOPLE.analyst) }, type: QueryTypes.SELECT })
  tableId = t!.id
  const [v] = await ownerDb().query<{ id: string }>(`INSERT INTO table_versions (org_id, table_id, number, author_id, content_hash) SELECT org_id, id, 1, created_by, 'x' FROM rate_tables WHERE id = :tableId RETURNING id`, { replacements: { tableId }, type: QueryTypes.SELECT })
  for (const [x, y] of [['60', '0.0081'], ['65', '0.0123'], ['70', '0.0194'], ['75', '0.0311'], ['80', '0.0502']]) await ownerDb().query('INSERT INTO version_points (version_id, x, y) VALUES (:id, :x, :y)', { replacements: { id: v!.id, x, y } })
  await ownerDb().query('UPDATE table_versions SET content_hash = kw_points_hash(id) WHERE id = :id', { replacements: { id: v!.id } })
})
test.afterAll(closeOwnerDb)

const tablePage = (page: Page) => page.goto(`/orgs/${ORG}/tables/${tableId}`)
async function chooseOnBench(page: Page, rationale: string) {
  await page.goto(`/orgs/${ORG}/tables/${tableId}/versions/1/bench`)
  await expect(page.getByTestId('bench-compare')).toBeEnabled({ timeout: 30_000 })
  await expect(page.getByTestId('bench-grid')).toBeVisible({ timeout: 30_000 })
  await page.getByTestId('choose-method').selectOption('Natural cubic spline')
  await page.getByTestId('choose-rationale').fill(rationale)
  await page.getByTestId('choose-save').click()
  await expect(page.getByTestId('saved-fill')).toContainText('Chosen fill: Natural cubic spline')
}

test('the bench speaks the table\u2019s unit and words; its comparison comes away as a file marked not signed off', async ({ page }) => {
  await signIn(page, PEOPLE.analyst)
  await page.goto(`/orgs/${ORG}/tables/${tableId}/versions/1/bench`)
  await expect(page.getByTestId('bench-grid')).toBeVisible({ timeout: 30_000 })
  await expect(page.getByTestId('bench-grid')).toContainText('Values side by side: q_x (per mille)')
  await expect(page.getByTestId('bench-grid').locator('tr[data-x="65"] td[data-col="1"]')).toHaveText('12.3')
  await expect(page.getByTestId('option-quadratic-condition').locator('option:checked')).toHaveText('Straight first piece')
  await expect(page.getByTestId('check-bump')).toContainText('‰')
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('bench-download-csv').click()])
  expect(download.suggestedFilename()).toMatch(/NOT-SIGNED-OFF\.csv$/)
  const csv = await readFile(await download.path(), 'utf8')
  const rows = parse(csv.replace(/^\uFEFF/, ''), { relax_column_count: true }) as string[][]
  expect(rows[0]![0]).toMatch(/^NOT SIGNED OFF: a comparison of 3 methods/)
  expect(csv).toContain('Age (years),Linear: q_x (per mille)')
  await shot(page, 'trust-bench-units')
})

test('a fill fitted on other points blocks Submit with a reason; choosing it again makes Submit pass', async ({ page }) => {
  await signIn(page, PEOPLE.analyst)
  await chooseOnBench(page, 'Natural cubic: smooth, through every point, one bend.')
  await tablePage(page)
  // the fill's values beside the given points, in per mille, every digit
  const values = page.getByTestId('fill-values')
  await expect(values).toContainText('Filled values')
  await expect(values.locator('tr[data-x="65"] td')).toHaveText('12.3')
  await expect(page.getByTestId('saved-settings')).toContainText('Interpolated on')
  const [xlsx] = await Promise.all([page.waitForEvent('download'), page.getByTestId('fill-download-xlsx').click()])
  const wb = new ExcelJS.Workbook()
  await wb.xlsx.load(await readFile(await xlsx.path()) as unknown as ArrayBuffer)
  expect(wb.worksheets.map(w => w.name)).toEqual(['Filled values, not signed off', 'Given points, not signed off', 'About this copy, not signed off'])
  expect(String(wb.getWorksheet('About this copy, not signed off')!.getCell('A2').value)).toMatch(/^NOT SIGNED OFF/)
  await shot(page, 'trust-table-fill-values')

  // a given point changes after the fill was chosen
  const version = await (await page.request.get(`/api/orgs/${ORG}/tables/${tableId}/versions/1`)).json() as { lockVersion: number, points: { x: string, y: string }[] }
  const saved = await page.request.put(`/api/orgs/${ORG}/tables/${tableId}/versions/1/points`, { headers: { origin: new URL(page.url()).origin }, data: { lockVersion: version.lockVersion, points: version.points.map(p => (p.x === '70' ? { ...p, y: '0.02' } : p)) } })
  expect(saved.status()).toBe(200)
  await tablePage(page)
  await expect(page.getByTestId('fill-stale')).toBeVisible()
  await expect(page.getByTestId('review-submit')).toBeDisabled()
  await expect(page.getByTestId('submit-blocked')).toContainText('fitted on other points')
  await shot(page, 'trust-stale-fill-blocks-submit')

  await chooseOnBench(page, 'Natural cubic again, on the corrected point at 70.')
  await tablePage(page)
  await expect(page.getByTestId('fill-stale')).toHaveCount(0)
  await page.getByTestId('review-submit').click()
  await expect(page.getByTestId('review-panel')).toContainText('Submitted by')
  await expect(page.getByTestId('review-thread')).toContainText('Asked for a second check')
})

test('sign-off and withdrawal ask first, with the consequences and the caution beside the button', async ({ page }) => {
  await signIn(page, PEOPLE.both)
  await tablePage(page)
  await expect(page.getByTestId('signoff-caution')).toContainText('qualified actuary')
  await page.getByTestId('review-approve').click()
  const dialog = page.getByTestId('confirm-approve')
  await expect(dialog).toContainText(`Sign off version 1 of ${NAME}?`)
  await expect(dialog).toContainText('can never be changed again')
  await expect(dialog).toContainText('qualified actuary')
  await shot(page, 'trust-confirm-sign-off')
  await dialog.getByTestId('confirm-approve-confirm').click()
  await expect(page.getByTestId('review-people')).toContainText('Signed off by')

  await page.getByTestId('review-text').fill('Basis replaced for the test; withdrawing.')
  await page.getByTestId('review-retire').click()
  const withdraw = page.getByTestId('confirm-retire')
  await expect(withdraw).toContainText('cannot be undone')
  await shot(page, 'trust-confirm-withdraw')
  await withdraw.getByTestId('confirm-retire-cancel').click()
  await expect(withdraw).toBeHidden()
  await expect(page.getByTestId('review-retire')).toBeVisible() // nothing happened
})

test('the audit trail reads as sentences, filters by days in the app\u2019s format, exports CSV and checks a head you hold', async ({ page }) => {
  await signIn(page, PEOPLE.auditor)
  await page.getByTestId('nav-audit').click()
  const events = page.getByTestId('audit-events')
  await expect(events).toContainText(`Signed off version 1 of ${NAME}`)
  await expect(events).toContainText(`Chose Natural cubic spline as the fill of version 1 of ${NAME}`)
  await expect(page.getByTestId('audit-numbering')).toContainText('without gaps')
  const today = new Date().toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric' })
  await page.getByTestId('audit-from').fill(today)
  await page.getByTestId('audit-from').press('Enter')
  await expect(events).toContainText(NAME)
  await page.getByTestId('audit-to').fill('31 Feb 2026')
  await page.getByTestId('audit-to').press('Enter')
  await expect(page.getByText('Write a day like 2 Dec 2026')).toBeVisible()
  await shot(page, 'trust-audit-sentences')

  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('audit-csv').click()])
  const check = checkAuditCsv(await readFile(await download.path(), 'utf8'))
  expect(check.problems).toEqual([])
  const newest = [...check.newest.entries()].find(([trail]) => trail !== 'System (sign-ins)')![1]
  await page.getByTestId('given-number').fill(String(newest.number))
  await page.getByTestId('given-hash').fill(newest.hash)
  await page.getByTestId('given-check').click()
  await expect(page.getByTestId('anchor-given')).toHaveAttribute('data-state', 'present')
  await expect(page.getByTestId('anchor-checkpoint').first()).toHaveAttribute('data-state', 'present')
  await shot(page, 'trust-audit-anchors')

  // narrow screens: nothing spills out sideways
  await page.setViewportSize({ width: 390, height: 800 })
  await page.reload()
  await expect(events).toBeVisible()
  expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth + 1)).toBe(true)
  await shot(page, 'trust-audit-narrow')
})
