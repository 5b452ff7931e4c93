import type { QueryInterface } from 'sequelize'
import { ddlRunner, dropTrigger, refusingTrigger } from '../utils/sql'

/**
 * The counter's day: delivery promises, split supply, picking, returns, invoices and credit notes.
 *
 * - branches: when the counter is open for collection, how long a part takes to reach the counter, how long stock
 *   sent from this branch takes to reach another (a transfer). `delivery_runs`: each branch's vans, leaving at a
 *   local time on the weekdays named, with a cut-off before each and a typical transit.
 * - `stock_bins`: where a part sits at a branch (the pick list is walked in bin order).
 * - order lines carry their own supply: where the units come from (home shelf, transfer, supplier back-order,
 *   counter collection), their state, when they are promised, and the tax stated for the line and its deposit
 *   (kept with the line, so splitting a line never moves the order's tax). Orders say whether to send what is
 *   here or wait for all, and whether they are collected.
 * - `dispatches`: each time the counter sends part or all of an order. `documents` / `document_lines`: invoices
 *   (one per dispatch) and credit notes (returns, warranty claims, cores), numbered from `document_series` in
 *   the write transaction that issues them (so a rolled-back issue gives its number back: no gaps), and
 *   immutable: triggers refuse any UPDATE or DELETE.
 * - `part_returns` and their photos; `basket_items`: the garage's basket kept with its account.
 * - garages approved before a home branch was asked for get the first branch, so they can order at all.
 */
export async function up(qi: QueryInterface): Promise<void> {
  const q = ddlRunner(qi)

  // ---------------------------------------------------------------- branches and their runs
  await q('ALTER TABLE branches ADD COLUMN collection BOOLEAN NOT NULL DEFAULT 1')
  // minutes after local midnight, weekdays
  await q('ALTER TABLE branches ADD COLUMN counter_opens_minute INTEGER NOT NULL DEFAULT 450 CHECK (counter_opens_minute BETWEEN 0 AND 1439)')
  await q('ALTER TABLE branches ADD COLUMN counter_closes_minute INTEGER NOT NULL DEFAULT 1050 CHECK (counter_closes_minute BETWEEN 0 AND 1440)')
  await q('ALTER TABLE branches ADD COLUMN collection_minutes INTEGER NOT NULL DEFAULT 15 CHECK (collection_minutes >= 0)')
  await q('ALTER TABLE branches ADD COLUMN transfer_minutes INTEGER NOT NULL DEFAULT 180 CHECK (transfer_minutes > 0)')
  await q(`CREATE TABLE delivery_runs (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    branch_id INTEGER NOT NULL REFERENCES branches(id) ON DELETE CASCADE,
    departs_minute INTEGER NOT NULL CHECK (departs_minute BETWEEN 0 AND 1439),
    cutoff_minutes INTEGER NOT NULL DEFAULT 30 CHECK (cutoff_minutes >= 0),
    transit_minutes INTEGER NOT NULL DEFAULT 45 CHECK (transit_minutes > 0),
    -- ISO weekday digits the van runs: 1 Monday ... 7 Sunday
    weekdays VARCHAR(7) NOT NULL DEFAULT '12345',
    created_at DATETIME NOT NULL,
    updated_at DATETIME NOT NULL,
    UNIQUE (branch_id, departs_minute)
  )`)
  await q(`CREATE TABLE stock_bins (
    part_id INTEGER NOT NULL REFERENCES parts(id) ON DELETE CASCADE,
    branch_id INTEGER NOT NULL REFERENCES branches(id) ON DELETE CASCADE,
    bin VARCHAR(16) NOT NULL,
    PRIMARY KEY (part_id, branch_id)
  )`)

  // ---------------------------------------------------------------- orders and their lines
  await q(`ALTER TABLE orders ADD COLUMN fulfilment VARCHAR(16) NOT NULL DEFAULT 'ship_available' CHECK (fulfilment IN ('ship_available', 'wait_for_all'))`)
  await q('ALTER TABLE orders ADD COLUMN collect BOOLEAN NOT NULL DEFAULT 0')
  // what was credited back for lines cancelled before they left (the refund of a card order sends this)
  await q('ALTER TABLE orders ADD COLUMN cancelled_minor INTEGER NOT NULL DEFAULT 0 CHECK (cancelled_minor >= 0)')

  await q(`CREATE TABLE dispatches (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    order_id INTEGER NOT NULL REFERENCES orders(id),
    seq INTEGER NOT NULL CHECK (seq > 0),
    branch_id INTEGER NOT NULL REFERENCES branches(id),
    dispatched_at DATETIME NOT NULL,
    dispatched_by_user_id INTEGER NULL REFERENCES users(id),
    created_at DATETIME NOT NULL,
    UNIQUE (order_id, seq)
  )`)

  await q(`ALTER TABLE order_lines ADD COLUMN source VARCHAR(12) NOT NULL DEFAULT 'home' CHECK (source IN ('home', 'transfer', 'back_order', 'collect'))`)
  await q('ALTER TABLE order_lines ADD COLUMN source_branch_id INTEGER NULL REFERENCES branches(id)')
  // reserved | waiting | picked | dispatched | cancelled
  await q(`ALTER TABLE order_lines ADD COLUMN state VARCHAR(12) NOT NULL DEFAULT 'reserved' CHECK (state IN ('reserved', 'waiting', 'picked', 'dispatched', 'cancelled'))`)
  await q(`ALTER TABLE order_lines ADD COLUMN fulfilment VARCHAR(16) NOT NULL DEFAULT 'ship_available' CHECK (fulfilment IN ('ship_available', 'wait_for_all'))`)
  // which requested line (basket line, quote line) this supply fills: a short line is split in several
  await q('ALTER TABLE order_lines ADD COLUMN line_group INTEGER NOT NULL DEFAULT 0')
  await q('ALTER TABLE order_lines ADD COLUMN promised_at DATETIME NULL')
  // when the units are (or will be) at the branch that sends the order: a transfer's arrival
  await q('ALTER TABLE order_lines ADD COLUMN ready_at DATETIME NULL')
  await q('ALTER TABLE order_lines ADD COLUMN reserved_at DATETIME NULL')
  await q('ALTER TABLE order_lines ADD COLUMN picked_quantity INTEGER NULL CHECK (picked_quantity IS NULL OR picked_quantity >= 0)')
  await q('ALTER TABLE order_lines ADD COLUMN dispatch_id INTEGER NULL REFERENCES dispatches(id)')
  await q('ALTER TABLE order_lines ADD COLUMN split_from_line_id INTEGER NULL REFERENCES order_lines(id)')
  await q('ALTER TABLE order_lines ADD COLUMN tax_minor INTEGER NOT NULL DEFAULT 0 CHECK (tax_minor >= 0)')
  await q('ALTER TABLE order_lines ADD COLUMN deposit_tax_minor INTEGER NOT NULL DEFAULT 0 CHECK (deposit_tax_minor >= 0)')
  // what was there before: every line came off its order's branch shelf; its tax was worked per line (deposits untaxed)
  await q(`UPDATE order_lines SET
      source_branch_id = (SELECT branch_id FROM orders o WHERE o.id = order_lines.order_id),
      tax_minor = (line_net_minor * (SELECT tax_rate_bp FROM orders o WHERE o.id = order_lines.order_id) + 5000) / 10000,
      line_group = position,
      state = CASE (SELECT status FROM orders o WHERE o.id = order_lines.order_id)
        WHEN 'dispatched' THEN 'dispatched' WHEN 'delivered' THEN 'dispatched' WHEN 'cancelled' THEN 'cancelled' ELSE 'reserved' END`)
  // the back-order queue: oldest order first, per part
  await q(`CREATE INDEX order_lines_waiting ON order_lines (part_id, state)`)
  await q('CREATE INDEX order_lines_dispatch ON order_lines (dispatch_id)')

  // ---------------------------------------------------------------- documents
  await q(`CREATE TABLE document_series (
    series VARCHAR(8) PRIMARY KEY,
    next_number INTEGER NOT NULL CHECK (next_number > 0)
  )`)
  await q(`INSERT INTO document_series (series, next_number) VALUES ('INV', 1), ('CRN', 1)`)
  await q(`CREATE TABLE documents (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    kind VARCHAR(12) NOT NULL CHECK (kind IN ('invoice', 'credit_note')),
    series VARCHAR(8) NOT NULL REFERENCES document_series(series),
    number INTEGER NOT NULL CHECK (number > 0),
    reference VARCHAR(20) NOT NULL UNIQUE,
    organisation_id INTEGER NOT NULL REFERENCES organisations(id),
    order_id INTEGER NOT NULL REFERENCES orders(id),
    dispatch_id INTEGER NULL UNIQUE REFERENCES dispatches(id),
    invoice_id INTEGER NULL REFERENCES documents(id),
    -- cancellation | return | warranty | core (credit notes)
    reason VARCHAR(16) NULL,
    issued_at DATETIME NOT NULL,
    -- a calendar day in the installation's time zone
    tax_point VARCHAR(10) NOT NULL,
    currency VARCHAR(3) NOT NULL,
    net_minor INTEGER NOT NULL CHECK (net_minor >= 0),
    tax_minor INTEGER NOT NULL CHECK (tax_minor >= 0),
    total_minor INTEGER NOT NULL CHECK (total_minor = net_minor + tax_minor),
    -- the particulars as issued (both parties with their tax numbers, terms, notes), printed as they were
    body TEXT NOT NULL,
    created_at DATETIME NOT NULL,
    UNIQUE (series, number),
    CHECK ((kind = 'invoice' AND invoice_id IS NULL AND series = 'INV') OR (kind = 'credit_note' AND invoice_id IS NOT NULL AND series = 'CRN'))
  )`)
  await q('CREATE INDEX documents_org ON documents (organisation_id, kind, id)')
  await q('CREATE INDEX documents_order ON documents (order_id)')
  await q('CREATE INDEX documents_invoice ON documents (invoice_id)')
  await q(`CREATE TABLE document_lines (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    document_id INTEGER NOT NULL REFERENCES documents(id),
    order_line_id INTEGER NULL REFERENCES order_lines(id),
    kind VARCHAR(12) NOT NULL CHECK (kind IN ('part', 'core_deposit', 'restocking')),
    sku VARCHAR(40) NOT NULL DEFAULT '',
    description VARCHAR(300) NOT NULL,
    quantity INTEGER NOT NULL CHECK (quantity > 0),
    unit_minor INTEGER NOT NULL,
    net_minor INTEGER NOT NULL,
    tax_bp INTEGER NOT NULL CHECK (tax_bp >= 0),
    tax_minor INTEGER NOT NULL,
    position INTEGER NOT NULL DEFAULT 0
  )`)
  await q('ALTER TABLE core_returns ADD COLUMN credit_note_id INTEGER NULL REFERENCES documents(id)')
  await q('CREATE INDEX document_lines_doc ON document_lines (document_id)')
  await q('CREATE INDEX document_lines_order_line ON document_lines (order_line_id, kind)')
  for (const table of ['documents', 'document_lines']) {
    await refusingTrigger(qi, table, 'UPDATE', 'an issued document cannot change: issue a credit note')
    await refusingTrigger(qi, table, 'DELETE', 'an issued document cannot be removed: issue a credit note')
  }

  // ---------------------------------------------------------------- returns
  await q(`CREATE TABLE part_returns (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    organisation_id INTEGER NOT NULL REFERENCES organisations(id),
    order_id INTEGER NOT NULL REFERENCES orders(id),
    order_line_id INTEGER NOT NULL REFERENCES order_lines(id),
    invoice_id INTEGER NOT NULL REFERENCES documents(id),
    reason VARCHAR(12) NOT NULL CHECK (reason IN ('wrong_part', 'not_needed', 'faulty')),
    quantity INTEGER NOT NULL CHECK (quantity > 0),
    note VARCHAR(500) NOT NULL DEFAULT '',
    fitted_on VARCHAR(10) NULL,
    mileage INTEGER NULL CHECK (mileage IS NULL OR mileage >= 0),
    fault TEXT NULL,
    -- requested | accepted | part_accepted | rejected
    status VARCHAR(14) NOT NULL,
    accepted_quantity INTEGER NULL CHECK (accepted_quantity IS NULL OR (accepted_quantity >= 0 AND accepted_quantity <= quantity)),
    decision_reason TEXT NULL,
    -- the restocking charge that applies, fixed when the garage asks (basis points of the credited net)
    restocking_bp INTEGER NOT NULL DEFAULT 0 CHECK (restocking_bp BETWEEN 0 AND 10000),
    credited_minor INTEGER NULL CHECK (credited_minor IS NULL OR credited_minor >= 0),
    credit_note_id INTEGER NULL REFERENCES documents(id),
    refund_pending BOOLEAN NOT NULL DEFAULT 0,
    refund_id VARCHAR(100) NULL,
    requested_by_user_id INTEGER NOT NULL REFERENCES users(id),
    decided_by_user_id INTEGER NULL REFERENCES users(id),
    decided_at DATETIME NULL,
    created_at DATETIME NOT NULL,
    updated_at DATETIME NOT NULL
  )`)
  await q('CREATE INDEX part_returns_org ON part_returns (organisation_id, id)')
  await q('CREATE INDEX part_returns_status ON part_returns (status, id)')
  await q('CREATE INDEX part_returns_line ON part_returns (order_line_id)')
  await q(`CREATE TABLE part_return_photos (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    return_id INTEGER NOT NULL REFERENCES part_returns(id) ON DELETE CASCADE,
    stored_name VARCHAR(80) NOT NULL UNIQUE,
    original_name VARCHAR(255) NOT NULL,
    mime VARCHAR(40) NOT NULL,
    size_bytes INTEGER NOT NULL,
    created_at DATETIME NOT NULL
  )`)
  await q('CREATE INDEX part_return_photos_return ON part_return_photos (return_id)')

  // ---------------------------------------------------------------- the basket
  await q(`CREATE TABLE basket_items (
    organisation_id INTEGER NOT NULL REFERENCES organisations(id) ON DELETE CASCADE,
    sku VARCHAR(40) NOT NULL,
    description VARCHAR(300) NOT NULL DEFAULT '',
    quantity INTEGER NOT NULL CHECK (quantity BETWEEN 1 AND 999),
    position INTEGER NOT NULL DEFAULT 0,
    updated_at DATETIME NOT NULL,
    PRIMARY KEY (organisation_id, sku)
  )`)

  // garages approved without a home branch could not order: give them the first branch (the admin can change it)
  await q(`UPDATE organisations SET home_branch_id = (SELECT MIN(id) FROM branches)
            WHERE kind = 'garage' AND status IN ('approved', 'suspended') AND home_branch_id IS NULL`)
}

export async function down(qi: QueryInterface): Promise<void> {
  const q = ddlRunner(qi)
  for (const table of ['documents', 'document_lines']) {
    await dropTrigger(qi, table, `${table}_immutable_update`)
    await dropTrigger(qi, table, `${table}_immutable_delete`)
  }
  for (const t of ['basket_items', 'part_return_photos', 'part_returns']) await q(`DROP TABLE ${t}`)
  await q('ALTER TABLE core_returns DROP COLUMN credit_note_id')
  await q('DROP INDEX IF EXISTS order_lines_waiting')
  await q('DROP INDEX IF EXISTS order_lines_dispatch')
  for (const c of ['deposit_tax_minor', 'tax_minor', 'split_from_line_id', 'dispatch_id', 'picked_quantity', 'reserved_at', 'ready_at', 'promised_at',
    'line_group', 'fulfilment', 'state', 'source_branch_id', 'source']) {
    await q(`ALTER TABLE order_lines DROP COLUMN ${c}`)
  }
  for (const t of ['document_lines', 'documents', 'document_series', 'dispatches']) await q(`DROP TABLE ${t}`)
  for (const c of ['cancelled_minor', 'collect', 'fulfilment']) await q(`ALTER TABLE orders DROP COLUMN ${c}`)
  for (const t of ['stock_bins', 'delivery_runs']) await q(`DROP TABLE ${t}`)
  for (const c of ['transfer_minutes', 'collection_minutes', 'counter_closes_minute', 'counter_opens_minute', 'collection']) await q(`ALTER TABLE branches DROP COLUMN ${c}`)
}
