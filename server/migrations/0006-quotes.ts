import type { QueryInterface } from 'sequelize'
import { ddlRunner } from '../utils/sql'

/**
 * Quotes: each garage's quoting settings, its quotes (one row per revision: a change to a sent quote makes a
 * new row with the same number and revision + 1, the old one kept as superseded) and their lines.
 *
 * Money is integer minor units, rates and markups basis points, labour hours hundredths of an hour.
 * The owner's link token is never stored: only its SHA-256 (`token_hash`).
 * `inspection_id` is a plain integer (inspections are the garage's own records, checked by the routes).
 */
export async function up(qi: QueryInterface): Promise<void> {
  const q = ddlRunner(qi)

  await q(`CREATE TABLE garage_settings (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    organisation_id INTEGER NOT NULL UNIQUE REFERENCES organisations(id) ON DELETE CASCADE,
    labour_rate_minor INTEGER NOT NULL DEFAULT 0 CHECK (labour_rate_minor >= 0), -- per hour, before tax
    -- JSON: { mode: "by_type", defaultBp, byType: { pad_set: 3500 } } | { mode: "by_cost", bands: [{ upToMinor, bp }] }
    markup_rules TEXT NOT NULL,
    tax_rate_bp INTEGER NOT NULL DEFAULT 2000 CHECK (tax_rate_bp BETWEEN 0 AND 10000),
    quote_validity_days INTEGER NOT NULL DEFAULT 30 CHECK (quote_validity_days BETWEEN 1 AND 365),
    quote_terms TEXT NOT NULL DEFAULT '',
    logo_file VARCHAR(80) NULL, -- server-generated name under the uploads folder
    logo_mime VARCHAR(40) NULL,
    logo_updated_at DATETIME NULL,
    created_at DATETIME NOT NULL,
    updated_at DATETIME NOT NULL
  )`)

  await q(`CREATE TABLE quotes (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    organisation_id INTEGER NOT NULL REFERENCES organisations(id) ON DELETE CASCADE,
    number INTEGER NOT NULL, -- per garage: 1, 2, 3 ...
    revision INTEGER NOT NULL DEFAULT 1 CHECK (revision >= 1),
    supersedes_quote_id INTEGER NULL REFERENCES quotes(id),
    status VARCHAR(20) NOT NULL DEFAULT 'draft'
      CHECK (status IN ('draft', 'sent', 'approved', 'partly_approved', 'declined', 'expired', 'superseded')),
    vehicle_id INTEGER NULL REFERENCES vehicles(id) ON DELETE SET NULL,
    vehicle_label VARCHAR(200) NOT NULL DEFAULT '', -- as it was when quoted, should the catalogue change
    registration VARCHAR(20) NOT NULL DEFAULT '',
    odometer VARCHAR(20) NOT NULL DEFAULT '',
    -- personal data of the vehicle's owner: read only by this garage (and the owner through the link)
    owner_name VARCHAR(120) NOT NULL,
    owner_email VARCHAR(254) NOT NULL,
    owner_phone VARCHAR(40) NOT NULL DEFAULT '',
    inspection_id INTEGER NULL,
    findings TEXT NOT NULL DEFAULT '[]', -- JSON [{ verdict, text }]: the inspection's findings in plain words
    message_to_owner TEXT NOT NULL DEFAULT '',
    token_hash CHAR(64) NULL UNIQUE, -- SHA-256 (hex) of the owner's link token
    sent_at DATETIME NULL,
    sent_by_user_id INTEGER NULL REFERENCES users(id),
    expires_at DATETIME NULL,
    decided_at DATETIME NULL,
    decision_ip VARCHAR(64) NULL,
    decision_user_agent VARCHAR(300) NULL,
    signed_name VARCHAR(120) NULL,
    created_by_user_id INTEGER NOT NULL REFERENCES users(id),
    created_at DATETIME NOT NULL,
    updated_at DATETIME NOT NULL,
    UNIQUE (organisation_id, number, revision)
  )`)
  await qi.addIndex('quotes', ['organisation_id', 'status'])
  await qi.addIndex('quotes', ['organisation_id', 'updated_at'])
  await qi.addIndex('quotes', ['status', 'expires_at'])

  await q(`CREATE TABLE quote_lines (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    quote_id INTEGER NOT NULL REFERENCES quotes(id) ON DELETE CASCADE,
    position INTEGER NOT NULL DEFAULT 0,
    kind VARCHAR(16) NOT NULL CHECK (kind IN ('part', 'labour', 'core_deposit', 'sundry', 'discount')),
    parent_line_id INTEGER NULL REFERENCES quote_lines(id) ON DELETE CASCADE, -- a core deposit's part line
    part_id INTEGER NULL REFERENCES parts(id) ON DELETE SET NULL,
    sku VARCHAR(40) NULL,
    part_type VARCHAR(24) NULL,
    description VARCHAR(300) NOT NULL,
    quantity INTEGER NOT NULL DEFAULT 1 CHECK (quantity >= 1),
    hours_hundredths INTEGER NULL CHECK (hours_hundredths IS NULL OR hours_hundredths > 0),
    rate_minor INTEGER NULL CHECK (rate_minor IS NULL OR rate_minor >= 0),
    unit_net_minor INTEGER NULL, -- the garage's net price when the line was added (parts, core deposits)
    markup_bp INTEGER NULL,
    unit_price_minor INTEGER NOT NULL DEFAULT 0, -- selling price per unit, before tax (negative for discounts)
    amount_minor INTEGER NOT NULL DEFAULT 0, -- the line's net amount, before tax
    tax_bp INTEGER NOT NULL CHECK (tax_bp BETWEEN 0 AND 10000),
    recommendation VARCHAR(10) NULL CHECK (recommendation IS NULL OR recommendation IN ('required', 'advised')),
    reason TEXT NULL, -- the finding behind a recommended line
    core_charge VARCHAR(10) NULL CHECK (core_charge IS NULL OR core_charge IN ('charged', 'absorbed')),
    owner_decision VARCHAR(10) NULL CHECK (owner_decision IS NULL OR owner_decision IN ('approved', 'declined')),
    told_owner_declined_required BOOLEAN NOT NULL DEFAULT 0, -- the garage told the owner what declining means
    told_owner_recorded_by_user_id INTEGER NULL REFERENCES users(id),
    told_owner_recorded_at DATETIME NULL,
    created_at DATETIME NOT NULL,
    updated_at DATETIME NOT NULL,
    CHECK ((kind = 'discount' AND amount_minor <= 0) OR (kind <> 'discount' AND amount_minor >= 0))
  )`)
  await qi.addIndex('quote_lines', ['quote_id', 'position'])
}

export async function down(qi: QueryInterface): Promise<void> {
  for (const t of ['quote_lines', 'quotes', 'garage_settings']) await qi.dropTable(t)
}
