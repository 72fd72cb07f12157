import { mkdtempSync } from 'node:fs'
import { readFile, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import path from 'node:path'
import ExcelJS from 'exceljs'
import { expect, test } from './fixtures'
import { PEOPLE, shot, signIn } from './helpers'

const dir = mkdtempSync(path.join(tmpdir(), 'kw-export-'))

test('the auditor downloads the signed curve, finds it genuine, and sees which cell an altered copy changed', async ({ page }) => {
  await signIn(page, PEOPLE.auditor)
  await page.getByRole('link', { name: 'Discount curve 2026-09-30' }).click()
  const panel = page.getByTestId('review-panel')
  await expect(panel).toContainText('Felix Amari')
  await expect(page.getByTestId('review-approve')).toHaveCount(0)
  await shot(page, 'export-table-review-panel')
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-download').click()])
  const original = path.join(dir, download.suggestedFilename())
  await download.saveAs(original)

  await page.getByTestId('nav-verify').click()
  await page.getByTestId('verify-file').setInputFiles(original)
  await page.getByTestId('verify-submit').click()
  await expect(page.getByTestId('verify-verdict')).toHaveAttribute('data-verdict', 'genuine-current')
  await expect(page.getByTestId('verify-verdict')).toContainText('Genuine and in force')
  await shot(page, 'export-verify-genuine')

  const wb = new ExcelJS.Workbook()
  await wb.xlsx.load(await readFile(original) as unknown as ArrayBuffer)
  const cell = wb.getWorksheet('Filled values')!.getCell('D17')
  cell.value = `${String(cell.value)}9`
  const altered = path.join(dir, 'altered.xlsx')
  await writeFile(altered, Buffer.from(await wb.xlsx.writeBuffer()))
  await page.getByTestId('verify-file').setInputFiles(altered)
  await page.getByTestId('verify-submit').click()
  await expect(page.getByTestId('verify-verdict')).toHaveAttribute('data-verdict', 'altered')
  await expect(page.getByTestId('verify-differences')).toContainText('Filled values!D17')
  await shot(page, 'export-verify-altered')
})

test('the audit trail shows the chain as intact and lists the export', async ({ page }) => {
  await signIn(page, PEOPLE.auditor)
  await page.getByTestId('nav-audit').click()
  await expect(page.getByTestId('chain-org')).toContainText('Intact')
  await expect(page.getByTestId('audit-events')).toContainText('Downloaded a signed export')
  await shot(page, 'audit-trail')
})

test('an actuary sees the second-check queue', async ({ page }) => {
  await signIn(page, PEOPLE.both)
  await page.getByTestId('nav-reviews').click()
  await expect(page.getByRole('heading', { name: 'Second check' })).toBeVisible()
  await shot(page, 'review-queue')
})

test('an administrator replaces the signing key; the old one stays listed as retired, and a long history folds away', async ({ page }) => {
  await signIn(page, PEOPLE.otherAdmin)
  await page.goto('/orgs/fenwick-rowe/verify')
  const panel = page.getByTestId('signing-keys')
  await expect(panel.getByRole('heading', { name: 'Signing keys' })).toBeVisible()
  const inUse = panel.locator('li[data-kid]', { hasText: 'In use' })
  const replace = async () => {
    await panel.getByTestId('rotate-key').click()
    await panel.getByTestId('rotate-key-confirm').click()
    await expect(panel.getByText('A new signing key is active')).toBeVisible()
  }
  // Without an earlier export the organisation has no key yet; the same button creates the first one.
  await expect(panel.locator('li[data-kid]').first().or(panel.getByText('No key yet'))).toBeVisible()
  if (await inUse.count() === 0) await replace()
  await expect(inUse).toHaveCount(1)
  const old = await inUse.getAttribute('data-kid')
  await replace()
  await expect(panel.getByText('Earlier files still verify against the retired key')).toBeVisible()
  await expect(inUse).toHaveCount(1)
  await expect(inUse).not.toHaveAttribute('data-kid', old!)
  await expect(panel.locator(`li[data-kid="${old}"]`)).toContainText('Retired')
  await shot(page, 'signing-keys-rotated')

  // a change names the app's origin, as the page's own fetch does (the server refuses any other)
  const origin = new URL(page.url()).origin
  for (let i = 0; i < 4; i++) expect((await page.request.post('/api/orgs/fenwick-rowe/signing-keys/rotate', { headers: { origin } })).ok()).toBe(true)
  const all = (await (await page.request.get('/api/orgs/fenwick-rowe/signing-keys')).json() as { keys: unknown[] }).keys.length
  await page.reload()
  await expect(panel.locator('li[data-kid]')).toHaveCount(4)
  await shot(page, 'signing-keys-folded')
  await panel.getByTestId('signing-keys-all').click()
  await expect(panel.locator('li[data-kid]')).toHaveCount(all)
  await expect(panel.locator(`li[data-kid="${old}"]`)).toContainText('Retired')
})

test('an auditor sees the signing keys but cannot replace them', async ({ page }) => {
  await signIn(page, PEOPLE.auditor)
  await page.goto('/orgs/larkspur-mutual/verify')
  await expect(page.getByTestId('signing-keys').getByRole('heading', { name: 'Signing keys' })).toBeVisible()
  await expect(page.getByTestId('rotate-key')).toHaveCount(0)
  await shot(page, 'signing-keys-auditor')
})
