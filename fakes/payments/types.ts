/**
 * The API objects the fake hands out: only the fields Boreline relies on, plus the usual envelope fields, so
 * that the SDK's types and the app's reads line up with what the real service sends.
 */

export type Metadata = Record<string, string>

export interface CheckoutSession {
  id: string
  object: 'checkout.session'
  amount_subtotal: number
  amount_total: number
  cancel_url: string | null
  client_reference_id: string | null
  created: number
  currency: string
  customer_details: { email: string | null } | null
  customer_email: string | null
  expires_at: number
  livemode: false
  locale: string | null
  metadata: Metadata
  mode: 'payment'
  payment_intent: string | PaymentIntent | null
  payment_method_types: string[]
  payment_status: 'unpaid' | 'paid'
  status: 'open' | 'complete' | 'expired'
  submit_type: string | null
  success_url: string | null
  ui_mode: 'hosted'
  url: string | null
}

export interface LineItem {
  id: string
  object: 'item'
  amount_discount: number
  amount_subtotal: number
  amount_tax: number
  amount_total: number
  currency: string
  description: string
  quantity: number
  price: {
    id: string
    object: 'price'
    currency: string
    product: string
    unit_amount: number
    type: 'one_time'
    livemode: false
  }
}

export interface PaymentError {
  type: 'card_error'
  code: string
  decline_code?: string
  message: string
  charge?: string
  payment_method?: { id: string; object: 'payment_method'; type: 'card'; card: { brand: string; last4: string } }
}

export interface PaymentIntent {
  id: string
  object: 'payment_intent'
  amount: number
  amount_capturable: number
  amount_received: number
  canceled_at: number | null
  cancellation_reason: string | null
  capture_method: string
  client_secret: string
  confirmation_method: 'automatic'
  created: number
  currency: string
  description: string | null
  last_payment_error: PaymentError | null
  latest_charge: string | Charge | null
  livemode: false
  metadata: Metadata
  payment_method: string | null
  payment_method_types: string[]
  receipt_email: string | null
  status: 'requires_payment_method' | 'requires_confirmation' | 'requires_capture' | 'processing' | 'succeeded' | 'canceled'
}

export interface Charge {
  id: string
  object: 'charge'
  amount: number
  amount_captured: number
  amount_refunded: number
  captured: boolean
  created: number
  currency: string
  failure_code: string | null
  failure_message: string | null
  livemode: false
  metadata: Metadata
  paid: boolean
  payment_intent: string | PaymentIntent
  payment_method: string
  refunded: boolean
  status: 'succeeded' | 'failed'
}

export interface Refund {
  id: string
  object: 'refund'
  amount: number
  charge: string | Charge
  created: number
  currency: string
  metadata: Metadata
  payment_intent: string | PaymentIntent
  reason: string | null
  status: 'succeeded'
}

export interface StripeEvent {
  id: string
  object: 'event'
  api_version: string
  created: number
  data: { object: object; previous_attributes?: Record<string, unknown> }
  livemode: false
  pending_webhooks: number
  request: { id: string | null; idempotency_key: string | null }
  type: string
}
