import type { QueryInterface } from 'sequelize'
import { ddlRunner } from '../utils/sql'

/**
 * Orders and payments: distributor orders with their lines, the payment events already handled (event id
 * unique, so a redelivered event changes nothing), each garage's ledger (signed amounts, running balance on
 * the statement) and the old units (cores) expected back against a deposit.
 *
 * Money columns are integer minor units. Amounts that can never be negative carry a CHECK.
 * `quote_id` / `quote_line_id` are plain integers rather than foreign keys: the quotes tables belong to
 * another migration and an order must stay readable even if a quote is later removed.
 */
export async function up(qi: QueryInterface): Promise<void> {
  const q = ddlRunner(qi)

  await q(`CREATE TABLE orders (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    organisation_id INTEGER NOT NULL REFERENCES organisations(id),
    branch_id INTEGER NOT NULL REFERENCES branches(id),
    placed_by_user_id INTEGER NOT NULL REFERENCES users(id),
    quote_id INTEGER NULL,
    -- awaiting_payment | queued | picking | dispatched | delivered | cancelled | lapsed
    status VARCHAR(20) NOT NULL,
    payment_method VARCHAR(10) NOT NULL CHECK (payment_method IN ('card', 'account')),
    -- unpaid | paid | on_account | refund_pending | refunded | credited
    payment_state VARCHAR(16) NOT NULL,
    subtotal_minor INTEGER NOT NULL CHECK (subtotal_minor >= 0),
    core_deposit_minor INTEGER NOT NULL DEFAULT 0 CHECK (core_deposit_minor >= 0),
    tax_rate_bp INTEGER NOT NULL,
    tax_minor INTEGER NOT NULL CHECK (tax_minor >= 0),
    total_minor INTEGER NOT NULL CHECK (total_minor >= 0),
    currency VARCHAR(3) NOT NULL,
    garage_reference VARCHAR(60) NOT NULL DEFAULT '',
    -- the garage's own key for "create this order once" (a double-click or a retried request)
    idempotency_key VARCHAR(80) NULL,
    -- true while the order holds stock at its branch
    stock_held BOOLEAN NOT NULL DEFAULT 1,
    checkout_session_id VARCHAR(100) NULL UNIQUE,
    -- bumped only when a new checkout has to be opened (the previous one expired); part of its idempotency key
    checkout_attempt INTEGER NOT NULL DEFAULT 0,
    payment_intent_id VARCHAR(100) NULL,
    decline_reason TEXT NULL,
    decline_code VARCHAR(60) NULL,
    declined_at DATETIME NULL,
    paid_at DATETIME NULL,
    picking_at DATETIME NULL,
    dispatched_at DATETIME NULL,
    delivered_at DATETIME NULL,
    cancelled_at DATETIME NULL,
    cancel_reason TEXT NULL,
    cancelled_by_user_id INTEGER NULL REFERENCES users(id),
    refund_id VARCHAR(100) NULL,
    created_at DATETIME NOT NULL,
    updated_at DATETIME NOT NULL
  )`)
  await qi.addIndex('orders', ['organisation_id', 'created_at'])
  await qi.addIndex('orders', ['branch_id', 'status'])
  await qi.addIndex('orders', ['organisation_id', 'idempotency_key'], { unique: true, name: 'orders_org_idempotency_key' })

  await q(`CREATE TABLE order_lines (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    order_id INTEGER NOT NULL REFERENCES orders(id) ON DELETE CASCADE,
    part_id INTEGER NOT NULL REFERENCES parts(id),
    sku VARCHAR(40) NOT NULL,
    description VARCHAR(300) NOT NULL,
    quantity INTEGER NOT NULL CHECK (quantity > 0),
    unit_list_minor INTEGER NOT NULL CHECK (unit_list_minor >= 0),
    unit_net_minor INTEGER NOT NULL CHECK (unit_net_minor >= 0),
    line_net_minor INTEGER NOT NULL CHECK (line_net_minor >= 0),
    core_deposit_unit_minor INTEGER NOT NULL DEFAULT 0 CHECK (core_deposit_unit_minor >= 0),
    quote_line_id INTEGER NULL,
    -- the unit net price the quote captured, to show what changed when it was re-priced
    quoted_unit_net_minor INTEGER NULL,
    position INTEGER NOT NULL DEFAULT 0
  )`)
  await qi.addIndex('order_lines', ['order_id'])

  // One row per payment-service event handled. Inserted in the same transaction as the event's effects.
  await q(`CREATE TABLE payment_events (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    event_id VARCHAR(100) NOT NULL UNIQUE,
    type VARCHAR(80) NOT NULL,
    order_id INTEGER NULL REFERENCES orders(id),
    outcome VARCHAR(200) NOT NULL DEFAULT '',
    created_at DATETIME NOT NULL
  )`)
  await qi.addIndex('payment_events', ['order_id'])

  // core returns first: ledger entries refer to them (PostgreSQL checks the reference when the table is made)
  await q(`CREATE TABLE core_returns (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    organisation_id INTEGER NOT NULL REFERENCES organisations(id),
    order_id INTEGER NOT NULL REFERENCES orders(id) ON DELETE CASCADE,
    order_line_id INTEGER NOT NULL UNIQUE REFERENCES order_lines(id) ON DELETE CASCADE,
    -- expected | booked | accepted | rejected | void (the order was cancelled; its deposit went back with it)
    status VARCHAR(12) NOT NULL,
    quantity_expected INTEGER NOT NULL CHECK (quantity_expected > 0),
    quantity_booked INTEGER NULL CHECK (quantity_booked IS NULL OR (quantity_booked > 0 AND quantity_booked <= quantity_expected)),
    deposit_unit_minor INTEGER NOT NULL CHECK (deposit_unit_minor >= 0),
    garage_note VARCHAR(300) NOT NULL DEFAULT '',
    booked_at DATETIME NULL,
    booked_by_user_id INTEGER NULL REFERENCES users(id),
    decided_at DATETIME NULL,
    decided_by_user_id INTEGER NULL REFERENCES users(id),
    reason TEXT NULL,
    credited_minor INTEGER NULL CHECK (credited_minor IS NULL OR credited_minor >= 0),
    refund_id VARCHAR(100) NULL,
    refund_pending BOOLEAN NOT NULL DEFAULT 0,
    created_at DATETIME NOT NULL,
    updated_at DATETIME NOT NULL
  )`)
  await qi.addIndex('core_returns', ['organisation_id', 'status'])
  await qi.addIndex('core_returns', ['status'])

  // What the garage owes the distributor: positive amounts raise the balance, negative ones lower it.
  await q(`CREATE TABLE ledger_entries (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    organisation_id INTEGER NOT NULL REFERENCES organisations(id),
    order_id INTEGER NULL REFERENCES orders(id),
    core_return_id INTEGER NULL REFERENCES core_returns(id),
    -- order | core_deposit | payment | refund | credit | core_credit
    kind VARCHAR(16) NOT NULL,
    amount_minor INTEGER NOT NULL,
    reference VARCHAR(60) NOT NULL,
    description VARCHAR(300) NOT NULL DEFAULT '',
    -- the payment service's id for the money movement (payment intent, refund), so it is booked once
    external_id VARCHAR(100) NULL,
    created_at DATETIME NOT NULL
  )`)
  await qi.addIndex('ledger_entries', ['organisation_id', 'id'])
  await qi.addIndex('ledger_entries', ['kind', 'external_id'], { unique: true, name: 'ledger_entries_kind_external' })
}

export async function down(qi: QueryInterface): Promise<void> {
  for (const t of ['core_returns', 'ledger_entries', 'payment_events', 'order_lines', 'orders']) await qi.dropTable(t)
}
