import type { QueryInterface } from 'sequelize'
import { ddlRunner } from '../utils/sql'

/**
 * A garage's own register of customers and vehicles, and the follow-up of work their owners declined:
 * - `garage_customers`: the owner's name and contact, and consent to reminders with when and how it was given;
 * - `garage_vehicles`: registration (normalised: capitals, no spaces) and VIN, each unique within the garage (two
 *   garages may hold the same car), the catalogue vehicle, the remembered option answers and the build month;
 * - `garage_vehicle_odometer`: readings with the day they were read, newest first on the vehicle's page;
 * - `follow_ups`: one per declined line, due some weeks after the owner's decision, then sent (with the new quote it
 *   made), held for lack of consent, or stopped; `follow_up_settings`: the garage's weeks;
 * - `wmi_codes`: world manufacturer identifiers (VIN positions 1-3) -> make, from the catalogue data;
 * - quotes and inspections link to the garage vehicle they were made for (nullable: older rows have none).
 */
export async function up(qi: QueryInterface): Promise<void> {
  const q = ddlRunner(qi)
  await q(`CREATE TABLE garage_customers (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    organisation_id INTEGER NOT NULL REFERENCES organisations(id) ON DELETE CASCADE,
    name VARCHAR(120) NOT NULL,
    email VARCHAR(254) NOT NULL DEFAULT '',
    phone VARCHAR(40) NOT NULL DEFAULT '',
    reminder_consent BOOLEAN NOT NULL DEFAULT 0,
    consent_changed_at DATETIME,
    consent_source VARCHAR(120) NOT NULL DEFAULT '',
    notes TEXT NOT NULL DEFAULT '',
    created_at DATETIME NOT NULL,
    updated_at DATETIME NOT NULL)`)
  await q('CREATE INDEX garage_customers_org_name ON garage_customers (organisation_id, name)')

  await q(`CREATE TABLE garage_vehicles (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    organisation_id INTEGER NOT NULL REFERENCES organisations(id) ON DELETE CASCADE,
    customer_id INTEGER REFERENCES garage_customers(id) ON DELETE SET NULL,
    registration VARCHAR(8),
    vin VARCHAR(17),
    vehicle_id INTEGER REFERENCES vehicles(id),
    answers TEXT NOT NULL DEFAULT '{}',
    built VARCHAR(7),
    notes TEXT NOT NULL DEFAULT '',
    created_at DATETIME NOT NULL,
    updated_at DATETIME NOT NULL,
    CHECK (registration IS NOT NULL OR vin IS NOT NULL))`)
  await q('CREATE UNIQUE INDEX garage_vehicles_org_vin ON garage_vehicles (organisation_id, vin) WHERE vin IS NOT NULL')
  await q('CREATE UNIQUE INDEX garage_vehicles_org_registration ON garage_vehicles (organisation_id, registration) WHERE registration IS NOT NULL')
  await q('CREATE INDEX garage_vehicles_customer ON garage_vehicles (customer_id)')

  await q(`CREATE TABLE garage_vehicle_odometer (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    garage_vehicle_id INTEGER NOT NULL REFERENCES garage_vehicles(id) ON DELETE CASCADE,
    reading INTEGER NOT NULL,
    unit VARCHAR(2) NOT NULL, -- mi | km
    read_on DATE NOT NULL,
    source VARCHAR(20) NOT NULL, -- recorded | inspection | quote
    created_at DATETIME NOT NULL)`)
  await q('CREATE INDEX garage_vehicle_odometer_vehicle ON garage_vehicle_odometer (garage_vehicle_id, read_on)')

  await q(`CREATE TABLE follow_up_settings (
    organisation_id INTEGER PRIMARY KEY REFERENCES organisations(id) ON DELETE CASCADE,
    advised_weeks INTEGER NOT NULL DEFAULT 8,
    required_weeks INTEGER NOT NULL DEFAULT 2,
    updated_at DATETIME NOT NULL)`)

  await q(`CREATE TABLE follow_ups (
    id INTEGER PRIMARY KEY AUTOINCREMENT,
    organisation_id INTEGER NOT NULL REFERENCES organisations(id) ON DELETE CASCADE,
    garage_vehicle_id INTEGER NOT NULL REFERENCES garage_vehicles(id) ON DELETE CASCADE,
    quote_id INTEGER NOT NULL REFERENCES quotes(id) ON DELETE CASCADE,
    quote_line_id INTEGER NOT NULL UNIQUE REFERENCES quote_lines(id) ON DELETE CASCADE,
    recommendation VARCHAR(10) NOT NULL, -- required | advised
    description VARCHAR(255) NOT NULL,
    due_at DATETIME NOT NULL,
    status VARCHAR(12) NOT NULL DEFAULT 'scheduled', -- scheduled | sending | sent | held | stopped | mail_failed
    status_note VARCHAR(200) NOT NULL DEFAULT '',
    sent_at DATETIME,
    new_quote_id INTEGER REFERENCES quotes(id) ON DELETE SET NULL,
    unsubscribe_hash VARCHAR(64),
    created_at DATETIME NOT NULL,
    updated_at DATETIME NOT NULL)`)
  await q('CREATE INDEX follow_ups_due ON follow_ups (status, due_at)')
  await q('CREATE INDEX follow_ups_org ON follow_ups (organisation_id, due_at)')
  await q('CREATE INDEX follow_ups_unsubscribe ON follow_ups (unsubscribe_hash)')

  await q(`CREATE TABLE wmi_codes (
    wmi VARCHAR(3) PRIMARY KEY,
    make VARCHAR(60) NOT NULL,
    country VARCHAR(60) NOT NULL DEFAULT '')`)

  // plain columns (SQLite cannot drop a column that carries a foreign key, and down must work); the services set
  // them only to a vehicle of the same garage
  await q('ALTER TABLE quotes ADD COLUMN garage_vehicle_id INTEGER')
  await q('CREATE INDEX quotes_garage_vehicle ON quotes (garage_vehicle_id)')
  await q('ALTER TABLE inspections ADD COLUMN garage_vehicle_id INTEGER')
  await q('CREATE INDEX inspections_garage_vehicle ON inspections (garage_vehicle_id)')
}

export async function down(qi: QueryInterface): Promise<void> {
  const q = ddlRunner(qi)
  await q('DROP INDEX IF EXISTS inspections_garage_vehicle')
  await q('ALTER TABLE inspections DROP COLUMN garage_vehicle_id')
  await q('DROP INDEX IF EXISTS quotes_garage_vehicle')
  await q('ALTER TABLE quotes DROP COLUMN garage_vehicle_id')
  for (const t of ['wmi_codes', 'follow_ups', 'follow_up_settings', 'garage_vehicle_odometer', 'garage_vehicles', 'garage_customers']) {
    await q(`DROP TABLE IF EXISTS ${t}`)
  }
}
