import type { Page } from '@playwright/test'
import { mkdirSync } from 'node:fs'
import { expect, test } from './fixtures'
import { PEOPLE, signIn } from './helpers'
import { demoSelectCells } from '../../scripts/seed/select-table'

// Everyday use (issue 18): the points grid keeps work safe (undo and redo, a question before unsaved edits are left,
// the hash and count after a save, decimal commas pasted), and keyboard shortcuts with "?" listing them.
const ORG = 'larkspur-mutual'

/** A one-way mortality table of its own (ages 60 to 64), made through the import API so demo tables stay as they are. */
async function ownTable(page: Page): Promise<string> {
  const origin = new URL(page.url()).origin
  const csv = `age,q\n${[0.011, 0.012, 0.0135, 0.015, 0.0168].map((q, i) => `${60 + i},${q}`).join('\n')}\n`
  const up = await page.request.post(`/api/orgs/${ORG}/imports`, { headers: { origin }, multipart: { file: { name: 'grid.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) } } })
  expect(up.status()).toBe(201)
  const mapping = { sheet: 'grid', headerRow: 0, axisColumn: 0, axis: 'age', axisUnit: 'years', columns: [{ index: 1, name: `Zz grid safety ${Date.now()}`, kind: 'mortality', valueUnit: 'per-unit' }] }
  const done = await page.request.post(`/api/orgs/${ORG}/imports/${(await up.json()).id}/commit`, { headers: { origin }, data: { mapping } })
  expect(done.status()).toBe(201)
  return (await done.json()).tables[0].id as string
}

/** The page's shortcuts are taken once it is mounted in the browser (html data-shortcuts lists them). */
async function shortcutsReady(page: Page, id: string) {
  await expect(page.locator('html')).toHaveAttribute('data-shortcuts', new RegExp(`(^| )${id}( |$)`))
}

async function screens(page: Page, name: string, fullPage = true) {
  mkdirSync('test-results/screens', { recursive: true })
  for (const width of [1440, 390]) {
    await page.setViewportSize({ width, height: 900 })
    await page.screenshot({ path: `test-results/screens/${name}-${width}.png`, fullPage })
  }
  await page.setViewportSize({ width: 1366, height: 860 })
}

function paste(page: Page, text: string) {
  return page.getByTestId('points-grid').evaluate((el, t) => {
    const data = new DataTransfer()
    data.setData('text/plain', t)
    el.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }))
  }, text)
}

test('the points grid undoes and redoes, pastes decimal commas, asks before unsaved edits are left, and saves with Ctrl+S', async ({ page }) => {
  await signIn(page, PEOPLE.analyst)
  const id = await ownTable(page)
  await page.goto(`/orgs/${ORG}/tables/${id}`)
  await shortcutsReady(page, 'draft-save')
  const grid = page.getByTestId('points-grid')
  const cell = (row: number, col: number) => grid.locator('tbody tr').nth(row).locator('td[role=gridcell]').nth(col)
  await expect(page.getByTestId('grid-undo')).toBeDisabled()

  // a cell edit, undone with Ctrl+Z and done again with Ctrl+Shift+Z (and Ctrl+Y)
  await cell(1, 1).click()
  await page.keyboard.press('Enter')
  await page.keyboard.press('Control+A')
  await page.keyboard.type('0.0125')
  // inside the cell being typed, Ctrl+Z is the browser's own text undo: the grid keeps its steps
  await page.keyboard.press('Enter')
  await expect(cell(1, 1)).toHaveText('0.0125')
  await page.keyboard.press('Control+Z')
  await expect(cell(1, 1)).toHaveText('0.012')
  await expect(page.getByTestId('grid-redo')).toBeEnabled()
  await page.keyboard.press('Control+Shift+Z')
  await expect(cell(1, 1)).toHaveText('0.0125')
  await page.getByTestId('grid-undo').click()
  await expect(cell(1, 1)).toHaveText('0.012')
  await grid.focus()
  await page.keyboard.press('Control+Y')
  await expect(cell(1, 1)).toHaveText('0.0125')

  // "0,45" and "0,69" pasted into the value column: two rows, the first not taken for a heading; one undo step
  await cell(3, 1).click()
  await paste(page, '0,45\n0,69\n')
  await expect(page.getByTestId('grid-message')).toHaveText('Pasted 2 rows; decimal commas read as points.')
  await expect(cell(3, 1)).toHaveText('0.45')
  await expect(cell(4, 1)).toHaveText('0.69')
  await page.keyboard.press('Control+Z')
  await expect(cell(3, 1)).toHaveText('0.015')
  await expect(cell(4, 1)).toHaveText('0.0168')
  // the ambiguous comma is refused with the reason, naming the line as pasted
  await cell(0, 0).click()
  await paste(page, 'Age\tq\n65,0,45\n')
  await expect(page.getByTestId('grid-message')).toContainText('Line 2')
  await paste(page, '65,0,45\n66,0,5')
  await expect(page.getByTestId('grid-message')).toContainText("Line 1 '65,0,45': the comma seems to stand both between columns and as the decimal mark")
  // a decimal comma typed into a cell is read as a point, and the grid says so
  await cell(4, 1).click()
  await page.keyboard.press('Enter')
  await page.keyboard.press('Control+A')
  await page.keyboard.type('0,0171')
  await page.keyboard.press('Enter')
  await expect(cell(4, 1)).toHaveText('0.0171')
  await expect(page.getByTestId('grid-message')).toHaveText('Read 0,0171 as 0.0171 (a decimal comma).')

  // a row added (one step), its age typed
  await page.getByTestId('add-row').click()
  await page.keyboard.type('65')
  await page.keyboard.press('Tab')
  await expect(cell(5, 0)).toHaveText('65')
  await screens(page, 'grid-unsaved')

  // leaving with unsaved edits asks: inside the app through the app's dialog, and the browser's own question
  expect(await page.evaluate(() => { const e = new Event('beforeunload', { cancelable: true }); window.dispatchEvent(e); return e.defaultPrevented })).toBe(true)
  await page.getByRole('link', { name: '← All tables' }).click()
  const ask = page.getByTestId('leave-unsaved')
  await expect(ask).toBeVisible()
  await expect(ask).toContainText('not saved')
  await screens(page, 'grid-leave-asked', false)
  await page.getByTestId('leave-unsaved-cancel').click()
  await expect(ask).toBeHidden()
  await expect(grid).toBeVisible()
  expect(page.url()).toContain(`/tables/${id}`)

  // Ctrl+S saves; the content hash and the point count come from the save's answer, without a reload
  const hash = await page.getByTestId('content-hash').textContent()
  await expect(page.getByTestId('version-1')).toContainText('5 points')
  let navigations = 0
  page.on('framenavigated', (f) => { if (f === page.mainFrame()) navigations++ })
  const saved = page.waitForResponse(r => r.request().method() === 'PUT' && r.url().endsWith('/versions/1/points'))
  // Ctrl+S in the middle of typing a cell keeps the typed text first
  await cell(5, 1).click()
  await page.keyboard.press('Enter')
  await page.keyboard.type('0.019')
  await page.keyboard.press('Control+S')
  const answer = await (await saved).json() as { contentHash: string, pointCount: number }
  expect(answer.pointCount).toBe(6)
  await expect(page.getByText(/Saved at/)).toBeVisible()
  await expect(page.getByTestId('content-hash')).toHaveText(answer.contentHash)
  expect(answer.contentHash).not.toBe(hash)
  await expect(page.getByTestId('version-1')).toContainText('6 points')
  await expect(cell(5, 1)).toHaveText('0.019')
  expect(navigations).toBe(0)
  // saved: nothing is asked any more
  expect(await page.evaluate(() => { const e = new Event('beforeunload', { cancelable: true }); window.dispatchEvent(e); return e.defaultPrevented })).toBe(false)
  await page.getByRole('link', { name: '← All tables' }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'Tables' })).toBeVisible()
  await expect(page.getByTestId('leave-unsaved')).toBeHidden()
})

test('"?" lists the shortcuts of the page; R runs the comparison on the bench; / goes to the search; N and P move through the import', async ({ page }) => {
  await signIn(page, PEOPLE.analyst)
  const id = await ownTable(page)

  // the tables list: "/" goes to the search field
  await page.goto(`/orgs/${ORG}`)
  await shortcutsReady(page, 'focus-search')
  await page.keyboard.press('/')
  await expect(page.getByTestId('table-search')).toBeFocused()
  // typing "?" into a field types it: no dialog
  await page.keyboard.type('?')
  await expect(page.getByTestId('shortcuts-dialog')).toBeHidden()

  // the bench: "?" lists its shortcuts first; Escape closes and the focus goes back
  await page.goto(`/orgs/${ORG}/tables/${id}/versions/1/bench`)
  await shortcutsReady(page, 'bench-run')
  await expect(page.getByTestId('bench-compare')).toBeEnabled({ timeout: 30_000 })
  await page.getByTestId('bench-compare').focus()
  await page.keyboard.press('?')
  const dialog = page.getByTestId('shortcuts-dialog')
  await expect(dialog).toBeVisible()
  await expect(dialog.getByTestId('shortcuts-here').first()).toContainText('Every page')
  await expect(dialog.getByTestId('shortcuts-here').nth(1)).toContainText('Fill bench')
  await expect(dialog.getByTestId('shortcuts-here').nth(1)).toContainText('Run the comparison with the settings shown')
  await expect(dialog.getByTestId('shortcuts-elsewhere').first()).toContainText('Table page (working draft)')
  await screens(page, 'shortcuts-dialog', false)
  await page.keyboard.press('Escape')
  await expect(dialog).toBeHidden()
  await expect(page.getByTestId('bench-compare')).toBeFocused()

  // R runs the comparison again
  const compare = page.waitForRequest(r => r.method() === 'POST' && /\/versions\/1\/compare$/.test(r.url()))
  await page.locator('h1').click()
  await page.keyboard.press('r')
  await compare
  await expect(page.getByTestId('bench-compare')).toBeEnabled({ timeout: 30_000 })

  // the import wizard: N to the columns, P back to the sheet
  await page.goto(`/orgs/${ORG}/imports/new`)
  await page.getByTestId('import-file').setInputFiles({ name: 'steps.csv', mimeType: 'text/csv', buffer: Buffer.from('age,q\n60,0.01\n61,0.011\n') })
  await page.waitForURL(/\/imports\/[0-9a-f-]{36}/)
  await expect(page.getByTestId('sheet-step')).toBeVisible()
  await shortcutsReady(page, 'wizard-next')
  await page.keyboard.press('n')
  await expect(page.getByTestId('to-check')).toBeVisible()
  await page.keyboard.press('p')
  await expect(page.getByTestId('sheet-step')).toBeVisible()
  await page.getByTestId('discard-import').click()
  await page.waitForURL(/\/imports\/new$/)
})

test('the two-way matrix undoes a typed cell with Ctrl+Z outside the text being typed, reads a decimal comma, and saves with Ctrl+S', async ({ page, baseURL }) => {
  await signIn(page, PEOPLE.analyst)
  const made = await page.request.post(`/api/orgs/${ORG}/tables/two-way`, {
    headers: { origin: new URL(baseURL!).origin },
    data: { name: `Zz matrix safety ${Date.now()}`, kind: 'mortality', axis: 'age', colAxis: 'duration', hasUltimate: true, valueUnit: 'per-mille', cells: demoSelectCells() },
  })
  expect(made.status()).toBe(201)
  await page.goto(`/orgs/${ORG}/tables/${(await made.json()).id}`)
  await shortcutsReady(page, 'draft-save')
  const cell = page.getByTestId('cell-30-0')
  await expect(cell).toHaveValue('0.5376')
  await cell.click()
  await page.keyboard.press('Control+A')
  await page.keyboard.type('0,6')
  await page.keyboard.press('Tab')
  await expect(page.getByTestId('cell-30-1')).toBeFocused()
  await expect(page.getByTestId('cells-undo')).toBeEnabled()
  // the next cell has not been typed in: Ctrl+Z is the grid's
  await page.keyboard.press('Control+Z')
  await expect(cell).toHaveValue('0.5376')
  await page.keyboard.press('Control+Shift+Z')
  await expect(cell).toHaveValue('0,6')
  const hash = await page.getByTestId('content-hash').textContent()
  const saved = page.waitForResponse(r => r.request().method() === 'PUT' && r.url().endsWith('/versions/1/cells'))
  await page.keyboard.press('Control+S')
  const answer = await (await saved).json() as { contentHash: string, cells: { x: string, d: string | null, y: string }[] }
  expect(answer.cells.find(c => c.x === '30' && c.d === '0')?.y).toBe('0.0006')
  await expect(page.getByTestId('content-hash')).toHaveText(answer.contentHash)
  expect(answer.contentHash).not.toBe(hash)
  await expect(cell).toHaveValue('0.6')
  await screens(page, 'matrix-saved')
})
