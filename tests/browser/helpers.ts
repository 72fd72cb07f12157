import type { Page } from '@playwright/test'
import { mkdirSync } from 'node:fs'

import { DEMO_PASSWORD, DEMO_PEOPLE } from '../demo-people'

export const PASSWORD = DEMO_PASSWORD
export const PEOPLE = DEMO_PEOPLE

let addressCounter = 0
/** Each test signs in from its own address (the test server trusts X-Forwarded-For). */
export async function useOwnAddress(page: Page) {
  addressCounter++
  await page.setExtraHTTPHeaders({ 'x-forwarded-for': `10.200.${process.pid & 255}.${addressCounter}` })
}

export async function signIn(page: Page, email: string, password = PASSWORD) {
  await useOwnAddress(page)
  await page.goto('/signin')
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL(/\/orgs\//)
}

export async function shot(page: Page, name: string) {
  mkdirSync('tests/browser/screenshots', { recursive: true })
  await page.screenshot({ path: `tests/browser/screenshots/${name}.png`, fullPage: true })
}
