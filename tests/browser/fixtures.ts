import { expect, test as base } from '@playwright/test'

// Every browser test runs under the app's Content-Security-Policy and fails if the browser reports a violation: each
// page reports `securitypolicyviolation` events to the console, and the console of every page of the app in the test's
// context is watched (Chromium also logs refused loads and inline code there itself). Pages of other origins (a
// forgery test's attacker page, refused a frame of ours) are not the app's.
export const test = base.extend<{ cspViolations: string[] }>({
  cspViolations: [async ({ context, baseURL }, use) => {
    const app = new URL(baseURL!).origin
    const violations: string[] = []
    await context.addInitScript(() => {
      document.addEventListener('securitypolicyviolation', (e) => {
        console.error(`[csp-violation] ${e.effectiveDirective} blocked ${e.blockedURI || 'inline'} at ${e.sourceFile}:${e.lineNumber}`)
      })
    })
    context.on('console', (message) => {
      const page = message.page()?.url() ?? ''
      if (page.startsWith(app) && /Content Security Policy|\[csp-violation\]/i.test(message.text())) violations.push(`${page}: ${message.text()}`)
    })
    await use(violations)
    expect(violations, 'the browser reported Content-Security-Policy violations').toEqual([])
  }, { auto: true }],
})

export { expect }
