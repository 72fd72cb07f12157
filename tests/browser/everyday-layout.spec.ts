import type { Page } from '@playwright/test'
import { mkdirSync } from 'node:fs'

import { expect, test } from './fixtures'
import { PEOPLE, signIn } from './helpers'

// Issue 18, everyday use: at phone width (390 px) no page scrolls sideways and Sign out is reached through the menu;
// every page writes dates one way ("2 Dec 2026", "2 Dec 2026, 07:27"); dark follows the system and the switch; print
// leaves the controls out and keeps the caution. One sign-in per role; screenshots at 390 and 1440 px under
// test-results/screens/.
const PHONE = { width: 390, height: 844 }
const WIDE = { width: 1440, height: 900 }
const DATE = /^\d{1,2} (?:Jan|Feb|Mar|Apr|May|Jun|Jul|Aug|Sep|Oct|Nov|Dec) \d{4}(?:, \d{2}:\d{2}(?::\d{2} [A-Z][\w+:-]*)?)?$/
const DATE_IN_TEXT = /\b\d{1,2} (?:Jan|Feb|Mar|Apr|May|Jun|Jul|Aug|Sep|Oct|Nov|Dec) \d{4}(?:, \d{2}:\d{2}(?::\d{2} [A-Z][\w+:-]*)?)?/g
// other ways of writing a date: 02/12/2026, a raw 2026-12-02T07:27 instant, Dec 2, 2026, "Sept", a time with seconds but no zone
const FOREIGN_DATES = [/\b\d{1,2}\/\d{1,2}\/\d{2,4}\b/, /\b\d{4}-\d{2}-\d{2}T\d{2}/, /\b(?:Jan|Feb|Mar|Apr|May|Jun|Jul|Aug|Sep|Oct|Nov|Dec)[a-z]* \d{1,2}, \d{4}/, /\bSept\b/]

mkdirSync('test-results/screens', { recursive: true })

/** The page's width against the window's, with the elements that stick out (outside any box that scrolls or clips). */
async function overflow(page: Page) {
  return page.evaluate(() => {
    const limit = window.innerWidth
    const clipped = (el: Element) => {
      for (let p = el.parentElement; p && p !== document.body; p = p.parentElement) if (getComputedStyle(p).overflowX !== 'visible') return true
      return false
    }
    const describe = (el: Element) => `${el.tagName.toLowerCase()}${el.id ? `#${el.id}` : ''}${el.getAttribute('data-testid') ? `[data-testid=${el.getAttribute('data-testid')}]` : ''}.${Array.from(el.classList).slice(0, 4).join('.')} (${Math.round(el.getBoundingClientRect().right)} px)`
    const wide = Array.from(document.body.querySelectorAll('*')).filter(el => el.getBoundingClientRect().right > limit + 1 && !clipped(el))
    return { scrollWidth: document.documentElement.scrollWidth, innerWidth: limit, widest: wide.slice(0, 3).map(describe) }
  })
}

/** Checks the page at 390 px (nothing sticks out), takes both screenshots, and checks its dates when asked. */
async function look(page: Page, name: string, opts: { dates?: boolean | 'if-any' } = {}) {
  await expect(page.locator('main h1').first()).toBeVisible()
  await page.evaluate(() => document.fonts.ready)
  const o = await overflow(page)
  expect(o.scrollWidth, `${name} is ${o.scrollWidth} px wide at ${o.innerWidth} px; sticking out: ${o.widest.join(', ')}`).toBeLessThanOrEqual(o.innerWidth)
  await page.screenshot({ path: `test-results/screens/${name}-390.png`, fullPage: true })
  await page.setViewportSize(WIDE)
  await page.screenshot({ path: `test-results/screens/${name}-1440.png`, fullPage: true })
  await page.setViewportSize(PHONE)
  if (opts.dates) {
    const text = await page.locator('body').innerText()
    for (const foreign of FOREIGN_DATES) expect(text.match(foreign)?.[0], `${name} writes a date another way`).toBeUndefined()
    const dates = text.match(DATE_IN_TEXT) ?? []
    if (opts.dates === true) expect(dates.length, `${name} shows dates`).toBeGreaterThan(0)
    for (const d of dates) expect(d).toMatch(DATE)
  }
}

/** The table pages listed on the organisation's home (the list rendered first). */
async function tableLinks(page: Page, org: string): Promise<string[]> {
  await expect(page.getByTestId('tables-list').locator('a').first()).toBeVisible()
  return page.getByTestId('tables-list').locator(`a[href^="/orgs/${org}/tables/"]`).evaluateAll(as => [...new Set(as.map(a => a.getAttribute('href')!))])
}

async function phone(page: Page, email: string) {
  await page.setViewportSize(PHONE)
  await signIn(page, email)
  return new URL(page.url()).pathname.split('/')[2]!
}

test.describe('everyday use at phone width', () => {
  test('the auth pages fit', async ({ page }) => {
    await page.setViewportSize(PHONE)
    for (const path of ['/signin', '/signup', '/forgot-password']) {
      await page.goto(path)
      await expect(page.locator('main').first()).toBeVisible()
      const o = await overflow(page)
      expect(o.scrollWidth, `${path} is ${o.scrollWidth} px wide; sticking out: ${o.widest.join(', ')}`).toBeLessThanOrEqual(o.innerWidth)
      await page.screenshot({ path: `test-results/screens/auth${path.replace('/', '-')}-390.png`, fullPage: true })
    }
  })

  test('an analyst: tables, a table, the benches, graduation, the import wizard, audit, account; the menu reaches Sign out', async ({ page }) => {
    const org = await phone(page, PEOPLE.analyst)
    const menu = page.getByTestId('menu-button')
    await expect(menu).toHaveAttribute('aria-expanded', 'false')
    await expect(page.getByTestId('sign-out')).toBeHidden()
    await look(page, 'analyst-tables', { dates: true })

    // a one-way and a two-way table, with their benches
    const tables = await tableLinks(page, org)
    const seen: Record<string, string> = {}
    for (const href of tables) {
      if (seen.bench && seen['grid-bench'] && seen.graduate) break
      await page.goto(href)
      await expect(page.locator('main h1').first()).toBeVisible()
      if (!seen.table) { seen.table = href; await look(page, 'analyst-table', { dates: true }) }
      for (const a of await page.getByTestId('open-bench').or(page.getByTestId('open-graduate')).evaluateAll(as => as.map(a => a.getAttribute('href')!))) {
        const kind = a.split('/').pop()!
        if (!seen[kind]) seen[kind] = a
      }
    }
    for (const kind of ['bench', 'grid-bench', 'graduate']) {
      expect(seen[kind], `a ${kind} link`).toBeTruthy()
      await page.goto(seen[kind]!)
      await look(page, `analyst-${kind}`)
    }

    // the import: upload, then the sheet and column steps
    await page.goto(`/orgs/${org}/imports/new`)
    await look(page, 'analyst-import-new')
    await page.getByTestId('import-file').setInputFiles('public/demo/larkspur-pensioner-study-2026.xlsx')
    await page.waitForURL(/\/imports\/[0-9a-f-]{36}/)
    await expect(page.getByTestId('sheet-step')).toBeVisible()
    await look(page, 'analyst-import-sheet')
    await page.getByTestId('to-columns').click()
    await expect(page.getByTestId('mapping-step')).toBeVisible()
    await look(page, 'analyst-import-mapping')
    for (const select of await page.getByTestId('mapping-step').locator('table select').all()) {
      expect((await select.boundingBox())!.width, 'a column dropdown is wide enough to read').toBeGreaterThan(120)
    }

    for (const [path, name] of [[`/orgs/${org}/audit`, 'analyst-audit'], ['/account', 'analyst-account']] as const) {
      await page.goto(path)
      await look(page, name, { dates: name.endsWith('audit') })
    }

    // the menu opens the navigation and the user menu; Sign out works from there
    await menu.click()
    await expect(menu).toHaveAttribute('aria-expanded', 'true')
    await expect(page.getByTestId('nav-tables')).toBeVisible()
    await page.screenshot({ path: 'test-results/screens/analyst-menu-open-390.png' })
    await page.getByTestId('sign-out').click()
    await page.waitForURL(/\/signin/)
  })

  test('an actuary: second check and a diff', async ({ page }) => {
    const org = await phone(page, PEOPLE.actuary)
    await page.goto(`/orgs/${org}/reviews`)
    await look(page, 'actuary-reviews', { dates: 'if-any' })
    await page.goto(`/orgs/${org}`)
    await expect(page.locator('main h1').first()).toBeVisible()
    const tables = await tableLinks(page, org)
    for (const href of tables) {
      await page.goto(href)
      const diff = page.getByTestId('compare-versions')
      await expect(page.locator('main h1').first()).toBeVisible()
      if (await diff.count()) {
        await diff.click()
        await page.waitForURL(/\/diff/)
        await look(page, 'actuary-diff')
        break
      }
    }
  })

  test('an admin: members and billing', async ({ page }) => {
    const org = await phone(page, PEOPLE.admin)
    await page.goto(`/orgs/${org}/members`)
    await look(page, 'admin-members', { dates: true })
    await page.goto(`/orgs/${org}/billing`)
    await look(page, 'admin-billing', { dates: true })
  })

  test('an auditor: audit with its day filter in our format, and checking a file', async ({ page }) => {
    const org = await phone(page, PEOPLE.auditor)
    await page.goto(`/orgs/${org}/verify`)
    await look(page, 'auditor-verify')
    await page.goto(`/orgs/${org}/audit`)
    await look(page, 'auditor-audit', { dates: true })
    const from = page.getByTestId('audit-from')
    await expect(from).toBeEnabled()
    expect(await from.getAttribute('type')).not.toBe('date')
    await expect(from).toHaveAttribute('placeholder', '2 Dec 2026')
    await from.fill('2026-01-05')
    await from.press('Enter')
    await expect(from).toHaveValue('5 Jan 2026')
    await from.fill('01/05/2026')
    await from.press('Enter')
    await expect(page.getByRole('alert').filter({ hasText: 'Write a day like 2 Dec 2026' })).toBeVisible()
  })
})

/** Relative luminance (0 black, 1 white) of a CSS rgb() colour. */
function luminance(css: string): number {
  const [r, g, b] = css.match(/[\d.]+/g)!.slice(0, 3).map(v => Number(v) / 255).map(c => c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4)
  return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!
}
const colours = (page: Page) => page.evaluate(() => ({
  ground: getComputedStyle(document.documentElement).backgroundColor,
  text: getComputedStyle(document.querySelector('main h1')!).color,
  theme: document.documentElement.className,
}))

test('dark follows the system; the switch overrides it and survives a reload', async ({ page }) => {
  await page.emulateMedia({ colorScheme: 'dark' })
  await signIn(page, PEOPLE.analyst)
  await expect(page.locator('main h1').first()).toBeVisible()
  let c = await colours(page)
  expect(luminance(c.ground), `dark ground, got ${c.ground}`).toBeLessThan(0.05)
  expect(luminance(c.text), `light text, got ${c.text}`).toBeGreaterThan(0.6)
  await page.screenshot({ path: 'test-results/screens/dark-tables-1440.png', fullPage: true })
  // a table page with its chart, in dark
  await page.locator('main a[href*="/tables/"]').first().click()
  await expect(page.locator('main h1').first()).toBeVisible()
  await expect(page.locator('main canvas').first()).toBeVisible()
  await page.screenshot({ path: 'test-results/screens/dark-table-1440.png', fullPage: true })

  // Light in the user menu wins over the system, and stays after a reload
  const choice = page.getByTestId('theme-choice')
  await choice.selectOption('light')
  await expect(page.locator('html')).toHaveClass(/\blight\b/)
  await page.reload()
  await expect(page.locator('main h1').first()).toBeVisible()
  c = await colours(page)
  expect(c.theme).toContain('light')
  expect(luminance(c.ground)).toBeGreaterThan(0.8)
  await expect(choice).toHaveValue('light')
  expect(await page.evaluate(() => localStorage.getItem('kw-theme'))).toBe('light')

  // Dark on a light system, also after a reload; System goes back to the system's
  await page.emulateMedia({ colorScheme: 'light' })
  await choice.selectOption('dark')
  await page.reload()
  await expect(page.locator('main h1').first()).toBeVisible()
  c = await colours(page)
  expect(luminance(c.ground)).toBeLessThan(0.05)
  await page.setViewportSize(PHONE)
  await page.screenshot({ path: 'test-results/screens/dark-table-390.png', fullPage: true })
  await page.setViewportSize(WIDE)
  await choice.selectOption('system')
  await expect.poll(async () => luminance((await colours(page)).ground)).toBeGreaterThan(0.8)
})

test('print leaves out navigation, buttons and fields, and keeps the caution and the signing details', async ({ page }) => {
  const org = await phone(page, PEOPLE.analyst)
  await page.setViewportSize({ width: 1000, height: 1200 })
  // an approved version: its status, who submitted and signed it off, its content hash
  const tables = await tableLinks(page, org)
  let bench = ''
  for (const href of tables) {
    await page.goto(href)
    await expect(page.locator('main h1').first()).toBeVisible()
    await expect(page.getByTestId('review-people')).toBeVisible()
    const link = page.locator('[data-testid=open-bench][href$="/bench"]')
    if (await page.getByTestId('review-people').getByText('Signed off by').count() && await link.count()) { bench = (await link.getAttribute('href'))!; break }
  }
  expect(bench, 'an approved one-way table with a bench').toBeTruthy()
  const pages: [string, string][] = [['table', page.url()], ['bench', bench], ['audit', `/orgs/${org}/audit`]]
  await page.emulateMedia({ media: 'print' })
  for (const [name, url] of pages) {
    if (name !== 'table') await page.goto(url)
    await expect(page.locator('main h1').first()).toBeVisible()
    await expect(page.locator('header')).toBeHidden()
    await expect(page.getByRole('note').filter({ hasText: 'qualified actuary' }).first()).toBeVisible()
    const controls = await page.evaluate(() => Array.from(document.querySelectorAll('button, input, select, textarea, nav, footer a, .btn-primary, .btn-quiet, .btn-danger'))
      .filter(el => (el as HTMLElement).offsetParent !== null || el.getClientRects().length > 0).map(el => el.outerHTML.slice(0, 80)))
    expect(controls, `${name} prints no controls`).toEqual([])
    if (name === 'table') {
      await expect(page.getByTestId('review-people')).toBeVisible()
      await expect(page.getByTestId('review-people')).toContainText('Signed off by')
      await expect(page.getByText('Content hash')).toBeVisible()
    }
    const wide = await page.evaluate(() => Array.from(document.querySelectorAll('canvas')).filter(c => c.getBoundingClientRect().right > document.documentElement.clientWidth + 1).length)
    expect(wide, `${name}: charts fit the page`).toBe(0)
    await page.screenshot({ path: `test-results/screens/print-${name}.png`, fullPage: true })
  }
})
