import { createHmac } from 'node:crypto'
import { cardError } from './errors.ts'

/** What a card does when charged (or set up on the hosted page). Numbers are Stripe's documented test cards. */
export interface CardBehaviour {
  brand: string
  funding: 'credit' | 'debit'
  decline?: { code: string; decline_code?: string; message: string }
  /** Declined already when set up (SetupIntent-like check on the hosted card page). */
  declinesOnSetup: boolean
}

const DECLINED = { code: 'card_declined', decline_code: 'generic_decline', message: 'Your card was declined.' }
const SPECIAL: Record<string, Partial<CardBehaviour>> = {
  '4000000000000002': { decline: DECLINED, declinesOnSetup: true },
  '4000000000009995': { decline: { code: 'card_declined', decline_code: 'insufficient_funds', message: 'Your card has insufficient funds.' }, declinesOnSetup: true },
  '4000000000000341': { decline: DECLINED, declinesOnSetup: false },
  '4000000000000069': { decline: { code: 'expired_card', message: 'Your card has expired.' }, declinesOnSetup: true },
  '4000000000000127': { decline: { code: 'incorrect_cvc', message: "Your card's security code is incorrect." }, declinesOnSetup: true },
  '4000056655665556': { funding: 'debit' },
}

/** Stripe's test PaymentMethod tokens; each use creates a fresh `pm_...`. */
export const PM_TOKENS: Record<string, string> = {
  pm_card_visa: '4242424242424242',
  pm_card_visa_debit: '4000056655665556',
  pm_card_mastercard: '5555555555554444',
  pm_card_amex: '378282246310005',
  pm_card_chargeDeclined: '4000000000000002',
  pm_card_visa_chargeDeclined: '4000000000000002',
  pm_card_chargeDeclinedInsufficientFunds: '4000000000009995',
  pm_card_visa_chargeDeclinedInsufficientFunds: '4000000000009995',
  pm_card_chargeCustomerFail: '4000000000000341',
  pm_card_chargeDeclinedExpiredCard: '4000000000000069',
  pm_card_chargeDeclinedIncorrectCvc: '4000000000000127',
}

/** `card[token]=tok_visa` etc. */
export const CARD_TOKENS: Record<string, string> = {
  tok_visa: '4242424242424242', tok_mastercard: '5555555555554444', tok_amex: '378282246310005',
  tok_chargeDeclined: '4000000000000002', tok_chargeDeclinedInsufficientFunds: '4000000000009995',
  tok_chargeCustomerFail: '4000000000000341',
}

function brandOf(number: string): string {
  if (number.startsWith('4')) return 'visa'
  if (/^5[1-5]/.test(number) || /^2[2-7]/.test(number)) return 'mastercard'
  if (/^3[47]/.test(number)) return 'amex'
  if (/^6(011|5)/.test(number)) return 'discover'
  return 'unknown'
}

// Luhn check digit (ISO/IEC 7812-1, Annex B).
export function luhnValid(number: string): boolean {
  let sum = 0
  for (let i = 0; i < number.length; i++) {
    let d = Number(number[number.length - 1 - i])
    if (i % 2 === 1) { d *= 2; if (d > 9) d -= 9 }
    sum += d
  }
  return sum % 10 === 0
}

export function cardBehaviour(number: string): CardBehaviour {
  return { brand: brandOf(number), funding: 'credit', declinesOnSetup: false, ...SPECIAL[number] }
}

/** Validates a raw card as Stripe does when a PaymentMethod is created (402 card_error). */
export function validateCard(number: string, expMonth: number, expYear: number, now: number): void {
  if (!/^\d{12,19}$/.test(number) || !luhnValid(number)) throw cardError('incorrect_number', 'Your card number is incorrect.', undefined, 'card[number]')
  if (expMonth < 1 || expMonth > 12) throw cardError('invalid_expiry_month', "Your card's expiration month is invalid.", undefined, 'card[exp_month]')
  const today = new Date(now * 1000)
  const year = today.getUTCFullYear()
  if (expYear < year || expYear > year + 50) throw cardError('invalid_expiry_year', "Your card's expiration year is invalid.", undefined, 'card[exp_year]')
  if (expYear === year && expMonth < today.getUTCMonth() + 1) throw cardError('invalid_expiry_month', "Your card's expiration month is invalid.", undefined, 'card[exp_month]')
}

export function cardFingerprint(number: string): string {
  return createHmac('sha256', 'knotwork-fake-stripe').update(number).digest('base64url').slice(0, 16)
}
