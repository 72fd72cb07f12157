import { expect, test } from './fixtures'
import { PEOPLE, shot, signIn } from './helpers'
import { demoSelectCells } from '../../scripts/seed/select-table'

// A two-way table's journey in the browser (issue 17): the matrix with its "to fill" cells, keyboard moves and a pasted
// block, saved; the two-way bench compares choices of a method per axis, draws one as lines and a heat map, and one is
// chosen with reasons; the table page then shows the filled table.
test('an analyst edits a select table as a matrix, compares fills on the two-way bench and chooses one', async ({ page, baseURL }) => {
  await signIn(page, PEOPLE.analyst)
  const name = `Select journey ${Math.random().toString(36).slice(2, 6)}`
  const made = await page.request.post('/api/orgs/larkspur-mutual/tables/two-way', {
    headers: { origin: new URL(baseURL!).origin },
    data: { name, kind: 'mortality', axis: 'age', colAxis: 'duration', hasUltimate: true, valueUnit: 'per-mille', cells: demoSelectCells() },
  })
  expect(made.status()).toBe(201)
  const table = await made.json() as { id: string }
  await page.goto(`/orgs/larkspur-mutual/tables/${table.id}`)

  // the matrix: entry ages down, durations across and the ultimate column; blank cells say "to fill"
  const grid = page.getByTestId('matrix-grid')
  await expect(grid).toContainText('Ultimate')
  await expect(page.getByTestId('cell-30-0')).toHaveValue('0.5376')
  await expect(page.getByTestId('cell-31-0')).toHaveAttribute('placeholder', 'to fill')
  await expect(page.getByTestId('cell-31-0')).toHaveValue('')
  await expect(page.getByTestId('version-1')).toContainText(/\d+ cells/)
  await expect(page.getByTestId('matrix-chart')).toBeVisible()
  await shot(page, 'two-way-matrix')

  // keyboard: Down, then Right moves to the next column; a typed value lands there
  await page.getByTestId('cell-30-0').focus()
  await page.keyboard.press('ArrowDown')
  await expect(page.getByTestId('cell-31-0')).toBeFocused()
  await page.keyboard.press('Tab')
  await expect(page.getByTestId('cell-31-1')).toBeFocused()
  // a block pasted at entry age 35, duration 0 (two rows of two): 35 gets new values, 36 becomes given at durations 0, 1
  await page.getByTestId('cell-35-0').focus()
  await page.getByTestId('cell-35-0').evaluate((el) => {
    const data = new DataTransfer()
    data.setData('text/plain', '0.69\t0.87\n0.73\t0.91\n')
    el.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }))
  })
  await expect(page.getByText('Pasted 4 cells.')).toBeVisible()
  await expect(page.getByTestId('cell-36-1')).toHaveValue('0.91')
  await expect(page.getByTestId('cell-35-1')).toHaveValue('0.87')
  // clear the pasted row 36 again so the given cells stay on full rows and columns, then save
  await page.getByTestId('cell-36-0').fill('')
  await page.getByTestId('cell-36-1').fill('')
  await page.getByTestId('save-cells').click()
  await expect(page.getByText(/Saved at/)).toBeVisible()

  // the two-way bench: three choices compared with the checks and the money
  await page.getByTestId('open-bench').click()
  await expect(page.getByRole('heading', { name: 'Two-way fill bench' })).toBeVisible()
  const results = page.getByTestId('grid-results')
  await expect(results).toContainText('Linear × Linear')
  await expect(results).toContainText('Natural cubic spline × Linear')
  await expect(page.getByTestId('grid-check-select-below-ultimate')).toContainText('Fine')
  await expect(page.getByTestId('grid-money-35')).toBeVisible()
  await expect(page.getByTestId('matrix-heatmap')).toBeVisible()
  await expect(page.getByRole('main').getByText(/qualified actuary/)).toBeVisible()
  await shot(page, 'two-way-bench')
  // the scale and the rule beyond the given cells are choices too: on ln q, compared again
  await expect(page.getByTestId('grid-extrapolation')).toHaveValue('error')
  await page.getByTestId('grid-transform').selectOption('log')
  await page.getByTestId('grid-compare').click()
  await expect(page.getByTestId('grid-compare')).toHaveText('Compare')
  await expect(results).toContainText('Natural cubic spline × Linear')

  await page.getByTestId('choose-method').selectOption('Natural cubic spline × Linear')
  await page.getByTestId('choose-rationale').fill('Smooth across entry ages; straight between durations; checks all fine.')
  await page.getByTestId('choose-save').click()
  await expect(page.getByTestId('saved-fill')).toContainText('Natural cubic spline × Linear')
  await expect(page.getByTestId('saved-settings')).toContainText('Natural cubic spline')

  // back on the table page the chosen fill is drawn and shown as a heat map
  await page.getByRole('link', { name: new RegExp(`${name}, version 1`) }).click()
  await expect(page.getByTestId('matrix-heatmap')).toBeVisible()
  await expect(page.getByTestId('saved-fill')).toBeVisible()
  // blank cells now show the chosen fill's value (grey italics) instead of "to fill", and stay blank
  await expect(page.getByTestId('cell-31-0')).toHaveAttribute('placeholder', /^\d+(\.\d+)?$/)
  await expect(page.getByTestId('cell-31-0')).toHaveValue('')
  await expect(page.getByTestId('cell-30-0')).toHaveValue('0.5376')
  await shot(page, 'two-way-filled')
})

test('an analyst imports the demo select workbook as a two-way table through the wizard', async ({ page }) => {
  const name = `Select import ${Math.random().toString(36).slice(2, 6)}`
  await signIn(page, PEOPLE.analyst)
  await page.getByTestId('nav-import').click()
  await page.getByTestId('import-file').setInputFiles('public/demo/larkspur-select-study-2026.xlsx')
  await page.waitForURL(/\/imports\/[0-9a-f-]{36}/)
  // the sheet reads as a matrix: durations 0 to 4 and an ultimate column, per mille from the notes
  const panel = page.getByTestId('matrix-panel')
  await expect(panel).toContainText('the last an ultimate column')
  await expect(page.getByTestId('matrix-unit')).toHaveValue('per-mille')
  await page.getByTestId('matrix-name').fill(name)
  await page.getByTestId('matrix-check').click()
  await expect(page.getByTestId('matrix-counts')).toHaveText('41 rows · 54 given cells · 192 to fill')
  await expect(page.getByTestId('matrix-errors')).toHaveText('0 blocking')
  await shot(page, 'two-way-import')
  await page.getByTestId('matrix-create').click()
  await page.waitForURL(/\/tables\/[0-9a-f-]{36}/)
  await expect(page.getByRole('heading', { name })).toBeVisible()
  await expect(page.getByTestId('cell-40-ult')).toHaveValue('2.3619')
  await expect(page.getByTestId('cell-41-ult')).toHaveAttribute('placeholder', 'to fill')
})
