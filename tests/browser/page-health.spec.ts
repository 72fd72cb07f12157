import type { Page } from '@playwright/test'
import AxeBuilder from '@axe-core/playwright'
import { expect, test } from './fixtures'
import { PEOPLE, signIn, useOwnAddress } from './helpers'
import { FENWICK, LARKSPUR } from '../demo-people'

// Issue 18, points 7 and 8: every main page, loaded directly (server render + hydration), as each role that uses it:
// no console error at all and no warning about hydration, and no serious or critical accessibility violation (axe-core).

interface Visit { path: string, ready: (page: Page) => Promise<void>, notFound?: boolean }
const heading = (name: string | RegExp) => async (page: Page) => { await expect(page.getByRole('heading', { name, level: 1 })).toBeVisible() }

async function tableId(page: Page, name: string | RegExp) {
  const tables = await (await page.request.get(`/api/orgs/${LARKSPUR}/tables`)).json() as { id: string, name: string }[]
  return tables.find(t => (typeof name === 'string' ? t.name === name : name.test(t.name)))!.id
}

/** Loads each page, waits for it to be ready and hydrated, and collects console errors and axe's serious findings. */
async function walk(page: Page, visits: Visit[]) {
  const problems: string[] = []
  let current = ''
  let expected404 = false
  page.on('console', (m) => {
    const text = m.text()
    if (expected404 && /Failed to load resource: the server responded with a status of 404/.test(text)) return
    if (m.type() === 'error' || (m.type() === 'warning' && /hydrat/i.test(text))) problems.push(`${current}: console ${m.type()}: ${text}`)
  })
  page.on('pageerror', e => problems.push(`${current}: uncaught ${e.message}`))
  for (const v of visits) {
    current = v.path
    expected404 = !!v.notFound
    await page.goto(v.path)
    await v.ready(page)
    await page.waitForFunction(() => (window as unknown as { useNuxtApp?: () => { isHydrating: boolean } }).useNuxtApp?.().isHydrating === false)
    const axe = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze()
    for (const found of axe.violations.filter(x => x.impact === 'serious' || x.impact === 'critical')) {
      problems.push(`${v.path}: axe ${found.impact} ${found.id} (${found.help}): ${found.nodes.slice(0, 4).map(n => n.target.join(' ')).join(' | ')}`)
    }
  }
  expect(problems, problems.join('\n')).toEqual([])
}

test('signed out: the sign-in page', async ({ page }) => {
  await useOwnAddress(page)
  await walk(page, [{ path: '/signin', ready: heading(/sign in/i) }])
})

test('an administrator\u2019s pages, and another organisation\u2019s table or a missing one (404)', async ({ page }) => {
  test.setTimeout(120_000)
  await signIn(page, PEOPLE.admin)
  const male = await tableId(page, 'Pensioner mortality, male')
  const o = `/orgs/${LARKSPUR}`
  await walk(page, [
    { path: o, ready: heading(/.+/) },
    { path: `${o}/members`, ready: heading('Members') },
    { path: `${o}/billing`, ready: heading(/billing/i) },
    { path: `${o}/audit`, ready: heading(/audit/i) },
    { path: `${o}/reviews`, ready: heading(/.+/) },
    { path: `${o}/verify`, ready: heading(/.+/) },
    { path: '/account', ready: heading(/.+/) },
    { path: `/orgs/${FENWICK}/tables/${male}`, ready: async (p) => { await expect(p.getByTestId('error-404')).toBeVisible() }, notFound: true },
    { path: `${o}/tables/00000000-0000-4000-8000-000000000000`, ready: async (p) => { await expect(p.getByTestId('error-404')).toBeVisible() }, notFound: true },
  ])
})

test('an actuary\u2019s table page, bench after its comparison, and graduate step', async ({ page }) => {
  test.setTimeout(120_000)
  await signIn(page, PEOPLE.actuary)
  const male = await tableId(page, 'Pensioner mortality, male')
  const versions = await (await page.request.get(`/api/orgs/${LARKSPUR}/tables/${male}/versions`)).json() as { number: number }[]
  const v = `/orgs/${LARKSPUR}/tables/${male}/versions/${versions[0]!.number}`
  await walk(page, [
    { path: `/orgs/${LARKSPUR}/tables/${male}`, ready: heading(/Pensioner mortality, male/) },
    { path: `${v}/bench`, ready: async (p) => {
      await expect(p.getByRole('heading', { name: 'Fill bench' })).toBeVisible()
      await expect(p.getByTestId('check-zigzag')).toBeVisible({ timeout: 30_000 })
    } },
    { path: `${v}/graduate`, ready: heading(/.+/) },
  ])
})

test('an analyst\u2019s pages: org home, import, two-way bench', async ({ page }) => {
  test.setTimeout(120_000)
  await signIn(page, PEOPLE.analyst)
  const select = await tableId(page, /select/i)
  const o = `/orgs/${LARKSPUR}`
  await walk(page, [
    { path: o, ready: heading(/.+/) },
    { path: `${o}/imports/new`, ready: heading('Import a spreadsheet') },
    { path: `${o}/my-work`, ready: async (p) => { await expect(p.getByTestId('my-submissions')).toBeVisible() } },
    { path: `${o}/tables/${select}`, ready: heading(/.+/) },
    { path: `${o}/tables/${select}/versions/1/grid-bench`, ready: heading(/.+/) },
    { path: `${o}/reviews`, ready: heading(/.+/) },
  ])
  // the wizard, after an upload
  await page.goto(`${o}/imports/new`)
  await page.getByTestId('import-file').setInputFiles('public/demo/larkspur-pensioner-study-2026.xlsx')
  await page.waitForURL(/\/imports\/[0-9a-f-]{36}/)
  await walk(page, [{ path: new URL(page.url()).pathname, ready: async (p) => { await expect(p.getByTestId('sheet-step')).toBeVisible() } }])
})

test('an auditor\u2019s pages', async ({ page }) => {
  await signIn(page, PEOPLE.auditor)
  const o = `/orgs/${LARKSPUR}`
  await walk(page, [
    { path: o, ready: heading(/.+/) },
    { path: `${o}/audit`, ready: heading(/audit/i) },
    { path: `${o}/verify`, ready: heading(/.+/) },
  ])
})
