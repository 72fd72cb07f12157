import Stripe from 'stripe'

let client: Stripe | undefined

/**
 * The Stripe SDK client, created on first use (the SDK refuses an empty key). NUXT_STRIPE_HOST/PORT/PROTOCOL point
 * it at the local fake; left empty it talks to api.stripe.com. No retries: a failure surfaces at once.
 */
export function useStripe(): Stripe {
  if (client) return client
  const config = useRuntimeConfig()
  const key = String(config.stripeSecretKey || '')
  if (!key) throw apiError(503, 'not-configured', 'Billing is not configured on this server (no Stripe key). Start it through npm start.')
  const host = String(config.stripeHost || '')
  const port = String(config.stripePort || '')
  const protocol = String(config.stripeProtocol || '')
  client = new Stripe(key, {
    ...(host ? { host } : {}),
    ...(port ? { port: Number(port) } : {}),
    ...(protocol === 'http' || protocol === 'https' ? { protocol } : {}),
    maxNetworkRetries: 0,
    telemetry: false,
    timeout: 15_000,
  })
  return client
}

/** The card-entry page for a customer. The local fake serves one at /hosted/setup; see DEVELOPERS.md for live keys. */
export function cardEntryUrl(customerId: string, returnUrl: string): string | null {
  const config = useRuntimeConfig()
  const host = String(config.stripeHost || '')
  if (!host) return null
  const protocol = String(config.stripeProtocol || 'https')
  const port = String(config.stripePort || '')
  const query = new URLSearchParams({ customer: customerId, return_url: returnUrl })
  return `${protocol}://${host}${port ? `:${port}` : ''}/hosted/setup?${query}`
}

/** Turns an SDK failure into an answer a person can act on (502 when Stripe cannot be reached). */
export function stripeFailure(error: unknown): never {
  if (error instanceof Stripe.errors.StripeConnectionError) {
    throw apiError(502, 'service-unreachable', 'The payment service cannot be reached just now. Try again in a minute.')
  }
  if (error instanceof Stripe.errors.StripeCardError) {
    throw apiError(402, 'payment-refused', `The card was refused: ${error.message}`)
  }
  if (error instanceof Stripe.errors.StripeError) {
    throw apiError(502, 'service-unreachable', `The payment service refused the request: ${error.message}`)
  }
  throw error
}

/** How far a webhook's signed timestamp may be from our clock, either way (Stripe's own default for the past). */
export const WEBHOOK_TOLERANCE_SECONDS = 300

/**
 * Verifies a webhook on its raw body and returns the event. The SDK refuses a bad signature and a timestamp more than
 * the tolerance in the past; a timestamp more than the tolerance in the future is refused here (the SDK accepts it,
 * which would let a captured signed body be replayed until that future time).
 */
export function verifyWebhook(raw: string | Buffer, signature: string, secret: string): Stripe.Event {
  const event = useStripe().webhooks.constructEvent(raw, signature, secret, WEBHOOK_TOLERANCE_SECONDS)
  const signedAt = Number(/(?:^|,)\s*t=(\d+)/.exec(signature)?.[1])
  if (!(signedAt <= Date.now() / 1000 + WEBHOOK_TOLERANCE_SECONDS)) throw new Error('The signed timestamp lies in the future.')
  return event
}
