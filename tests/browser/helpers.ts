import type { Page } from '@playwright/test'
import { mkdirSync } from 'node:fs'

export const PASSWORD = 'knotwork-demo-2026'
export const PEOPLE = {
  admin: 'hazel.okafor@larkspur.example',
  actuary: 'tomas.varga@larkspur.example',
  analyst: 'priya.raman@larkspur.example',
  auditor: 'greta.lind@larkspur.example',
  both: 'felix.amari@fenwickrowe.example',
  otherAdmin: 'oona.pike@fenwickrowe.example',
} as const

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
