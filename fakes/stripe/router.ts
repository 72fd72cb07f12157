import type { Route } from './route.ts'
import { routes as customers } from './resources/customers.ts'
import { routes as events } from './resources/events.ts'
import { routes as invoiceItems } from './resources/invoice_items.ts'
import { routes as invoices } from './resources/invoices.ts'
import { routes as paymentMethods } from './resources/payment_methods.ts'
import { routes as prices } from './resources/prices.ts'
import { routes as products } from './resources/products.ts'
import { routes as subscriptionItems } from './resources/subscription_items.ts'
import { routes as subscriptions } from './resources/subscriptions.ts'
import { routes as webhookEndpoints } from './resources/webhook_endpoints.ts'

interface Compiled { route: Route; re: RegExp; names: string[] }

const ALL: Route[] = [...customers, ...products, ...prices, ...paymentMethods, ...subscriptions, ...subscriptionItems,
  ...invoices, ...invoiceItems, ...events, ...webhookEndpoints]

/** Literal segments first, so `/v1/invoices/upcoming`-style paths never fall into `/:id`. */
const COMPILED: Compiled[] = ALL.map((route) => {
  const names: string[] = []
  const re = new RegExp(`^${route.path.replace(/:([a-z]+)/g, (_, n: string) => { names.push(n); return '([^/]+)' })}$`)
  return { route, re, names }
}).sort((a, b) => a.names.length - b.names.length)

export function matchRoute(method: string, path: string): { route: Route; params: Record<string, string> } | undefined {
  for (const c of COMPILED) {
    if (c.route.method !== method) continue
    const m = c.re.exec(path)
    if (m) return { route: c.route, params: Object.fromEntries(c.names.map((n, i) => [n, decodeURIComponent(m[i + 1]!)])) }
  }
  return undefined
}
