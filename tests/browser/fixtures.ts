import { expect, test as base } from '@playwright/test'

// Every browser test runs under the app's Content-Security-Policy and fails if the browser reports a violation: each
// page reports `securitypolicyviolation` events to the console, and the console of every page in the test's context
// is watched (Chromium also logs refused loads and inline code there itself).
export const test = base.extend<{ cspViolations: string[] }>({
  cspViolations: [async ({ context }, use) => {
    const violations: string[] = []
    await context.addInitScript(() => {
      document.addEventListener('securitypolicyviolation', (e) => {
        console.error(`[csp-violation] ${e.effectiveDirective} blocked ${e.blockedURI || 'inline'} at ${e.sourceFile}:${e.lineNumber}`)
      })
    })
    context.on('console', (message) => {
      if (/Content Security Policy|\[csp-violation\]/i.test(message.text())) violations.push(`${message.location().url}: ${message.text()}`)
    })
    await use(violations)
    expect(violations, 'the browser reported Content-Security-Policy violations').toEqual([])
  }, { auto: true }],
})

export { expect }
