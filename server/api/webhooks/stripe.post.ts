import type Stripe from 'stripe'
import { processStripeEvent } from '~~/server/services/stripe-events'

// Stripe's webhook: the signature is checked on the raw body, its timestamp within 300 s either way; 400 otherwise.
// Exempt from the same-origin check (server/middleware/01.same-origin.ts): the signature is its proof.
export default defineEventHandler(async (event) => {
  const secret = String(useRuntimeConfig().stripeWebhookSecret || '')
  if (!secret) throw apiError(503, 'not-configured', 'Webhooks are not configured on this server.')
  const raw = await readRawBody(event, false)
  const signature = getRequestHeader(event, 'stripe-signature')
  if (!raw || !signature) throw apiError(400, 'invalid-input', 'A signed Stripe event is required.')
  let stripeEvent: Stripe.Event
  try {
    stripeEvent = verifyWebhook(raw, signature, secret)
  } catch {
    throw apiError(400, 'invalid-input', 'The signature does not verify (wrong secret, altered body, or a timestamp more than 5 minutes from now either way).')
  }
  try {
    return { received: true, outcome: await processStripeEvent(stripeEvent) }
  } catch (error) {
    // not recorded: Stripe delivers the event again later
    console.error(`[webhook] ${stripeEvent.type} ${stripeEvent.id} not processed: ${(error as Error).message}`)
    throw apiError(500, 'try-later', 'The event could not be processed now; send it again later.')
  }
})
