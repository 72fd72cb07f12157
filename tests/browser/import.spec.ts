import { expect, test } from './fixtures'
import { PEOPLE, shot, signIn } from './helpers'

test('an analyst imports the demo workbook, fixes the flagged cell, creates the drafts and finds them', async ({ page }) => {
  const suffix = Math.random().toString(36).slice(2, 6)
  await signIn(page, PEOPLE.analyst)
  await page.getByTestId('nav-import').click()
  await expect(page.getByRole('heading', { name: 'Import a spreadsheet' })).toBeVisible()
  await shot(page, 'import-upload')
  // the sheet is described once: taking the proposed header row must not fetch it again (that refetch reset the
  // mapping, and a table name typed meanwhile was lost)
  const described: string[] = []
  page.on('request', (r) => { if (r.method() === 'GET' && /\/api\/orgs\/[^/]+\/imports\/[0-9a-f-]{36}(\?|$)/.test(r.url())) described.push(r.url()) })
  await page.getByTestId('import-file').setInputFiles('public/demo/larkspur-pensioner-study-2026.xlsx')
  await page.waitForURL(/\/imports\/[0-9a-f-]{36}/)

  // sheet and header: the header row under the notes is proposed
  await expect(page.getByTestId('sheet-step')).toBeVisible()
  await expect(page.getByTestId('header-row')).toHaveValue('5')
  await page.waitForLoadState('networkidle')
  expect(described.filter(u => /headerRow=/.test(u))).toEqual([])
  await shot(page, 'import-sheet')
  await page.getByTestId('to-columns').click()

  // columns: percent detected from the header; give the tables names of our own
  await expect(page.getByTestId('mapping-step')).toBeVisible()
  await expect(page.getByText('Detected: the header says percent.').first()).toBeVisible()
  await page.getByLabel('Table name for Male q_x (%)').fill(`Study 2026 male ${suffix}`)
  await page.getByLabel('Table name for Female q_x (%)').fill(`Study 2026 female ${suffix}`)
  await shot(page, 'import-mapping')
  await page.getByTestId('to-check').click()

  // check: the bad cell is named and blocks; fix it in place and check again
  await expect(page.getByTestId('findings')).toContainText("Sheet 'Study 2026' C17: 'n/a' is not a number")
  await expect(page.getByTestId('create-drafts')).toBeDisabled()
  await shot(page, 'import-findings')
  const cell = page.getByTestId('fix-C17')
  await cell.fill('58.12')
  await cell.press('Tab')
  await page.getByTestId('check-again').click()
  await expect(page.getByTestId('error-count')).toHaveText('0 blocking')
  await expect(page.getByTestId('findings')).toContainText('No findings')
  await page.getByTestId('create-drafts').click()

  await expect(page.getByTestId('import-done')).toContainText(`Study 2026 male ${suffix}`)
  await shot(page, 'import-done')
  await page.getByTestId('to-tables').click()
  await page.getByTestId('table-search').fill(suffix)
  const list = page.getByTestId('tables-list')
  await expect(list).toContainText(`Study 2026 male ${suffix}`)
  await expect(list).toContainText(`Study 2026 female ${suffix}`)
  await expect(list.getByText('Working draft')).toHaveCount(2)
  await shot(page, 'import-in-list')

  // the table page shows the draft's points (in percent, exactly as given) and a chart
  await list.getByRole('link', { name: `Study 2026 female ${suffix}` }).click()
  await expect(page.getByTestId('points-grid')).toContainText('58.12')
  await expect(page.getByTestId('points-chart')).toBeVisible()
  await shot(page, 'table-draft')
})

test('a draft grid edits with the keyboard and saves; an auditor sees no edit controls', async ({ page }) => {
  await signIn(page, PEOPLE.analyst)
  await page.getByRole('link', { name: 'Lapse rates, regular premium savings' }).click()
  const grid = page.getByTestId('points-grid')
  await expect(grid).toContainText('12')
  await grid.click()
  await grid.locator('td[role=gridcell]').nth(1).click()
  await page.keyboard.press('Enter')
  await page.keyboard.press('Control+A')
  await page.keyboard.type('12.5')
  await page.keyboard.press('Enter')
  await expect(grid).toContainText('12.5')
  await page.getByTestId('save-points').click()
  await expect(page.getByText(/Saved at/)).toBeVisible()
  await shot(page, 'table-saved')

  await page.getByTestId('sign-out').click()
  await signIn(page, PEOPLE.auditor)
  await page.getByRole('link', { name: 'Lapse rates, regular premium savings' }).click()
  await expect(page.getByTestId('points-grid')).toContainText('12.5')
  await expect(page.getByTestId('save-points')).toHaveCount(0)
  await expect(page.getByTestId('nav-import')).toHaveCount(0)
})
