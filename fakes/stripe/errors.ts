export interface StripeErrorBody {
  type: 'invalid_request_error' | 'card_error' | 'idempotency_error' | 'api_error' | 'authentication_error'
  code?: string
  decline_code?: string
  message: string
  param?: string
  [extra: string]: unknown
}

/**
 * An error answered in Stripe's shape `{ error: {...} }`.
 * `keepState`: the request's state changes are committed even though it fails
 * (a declined `invoices.pay` still records the attempt and emits `invoice.payment_failed`).
 */
export class StripeApiError extends Error {
  constructor(public status: number, public body: StripeErrorBody, public keepState = false) {
    super(body.message)
  }
}

export function invalid(message: string, param?: string, code?: string): StripeApiError {
  return new StripeApiError(400, { type: 'invalid_request_error', message, ...(param ? { param } : {}), ...(code ? { code } : {}) })
}

/** Missing object: 404 when named in the path, 400 when named in a parameter (as Stripe does). */
export function missing(kind: string, id: string, param?: string): StripeApiError {
  return new StripeApiError(param ? 400 : 404, {
    type: 'invalid_request_error', code: 'resource_missing', message: `No such ${kind}: '${id}'`, param: param ?? 'id',
  })
}

export function cardError(code: string, message: string, declineCode?: string, param = ''): StripeApiError {
  return new StripeApiError(402, { type: 'card_error', code, message, param, ...(declineCode ? { decline_code: declineCode } : {}) })
}
