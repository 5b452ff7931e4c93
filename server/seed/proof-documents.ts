/**
 * Proof-of-trade documents for the demo applications that are still on file (the pending and the rejected
 * garage), so the admin's queue has a document to open. A small generated PDF each, stored like an upload under
 * <uploads>/proofs/, with a name derived from the organisation (so seeding many throw-away databases, as the
 * tests do, reuses two files instead of piling up new ones). Idempotent: an existing row is kept; its file is
 * rewritten if missing.
 */
import { createHash } from 'node:crypto'
import { existsSync } from 'node:fs'
import { mkdir, writeFile } from 'node:fs/promises'
import type { Transaction } from 'sequelize'
import { Organisation } from '../models/accounts'
import { ProofDocument } from '../models/accounts-extra'
import { proofPath, proofsDir } from '../services/proof-store'

const DOCS: { organisation: string; originalName: string; lines: string[] }[] = [
  {
    organisation: 'Ashcombe Car Care', originalName: 'ashcombe-trade-registration.pdf',
    lines: ['Certificate of trade registration (demo document)', 'Ashcombe Car Care, 88 Ashcombe Parade, Northgate NG9 1LB', 'Tax number GB 733 1200 41', 'Motor vehicle servicing and repair'],
  },
  {
    organisation: 'Fernside Vehicle Repairs', originalName: 'fernside-registration.pdf',
    lines: ['Trade registration (demo document)', 'Fernside Vehicle Repairs, Fernside Industrial Estate, Riverside RV4 2DD', 'Tax number GB 000 0000 00'],
  },
]

/** A one-page PDF with these lines of Helvetica text, with a correct cross-reference table. */
export function tinyPdf(lines: string[]): Buffer {
  const esc = (s: string) => s.replace(/[\\()]/g, (c) => `\\${c}`)
  const text = lines.map((l, i) => `BT /F1 ${i === 0 ? 16 : 11} Tf 56 ${760 - i * 24} Td (${esc(l)}) Tj ET`).join('\n')
  const objects = [
    '<< /Type /Catalog /Pages 2 0 R >>',
    '<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
    '<< /Type /Page /Parent 2 0 R /MediaBox [0 0 595 842] /Contents 4 0 R /Resources << /Font << /F1 5 0 R >> >> >>',
    `<< /Length ${Buffer.byteLength(text, 'latin1')} >>\nstream\n${text}\nendstream`,
    '<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica >>',
  ]
  let out = '%PDF-1.4\n'
  const offsets: number[] = []
  objects.forEach((o, i) => {
    offsets.push(Buffer.byteLength(out, 'latin1'))
    out += `${i + 1} 0 obj\n${o}\nendobj\n`
  })
  const xref = Buffer.byteLength(out, 'latin1')
  out += `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n${offsets.map((n) => `${String(n).padStart(10, '0')} 00000 n \n`).join('')}`
  out += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R >>\nstartxref\n${xref}\n%%EOF\n`
  return Buffer.from(out, 'latin1')
}

export async function seedProofDocuments(t: Transaction, log: (s: string) => void): Promise<void> {
  const uploadsDir = process.env.NUXT_UPLOADS_DIR || './uploads'
  await mkdir(proofsDir(uploadsDir), { recursive: true })
  let written = 0
  for (const d of DOCS) {
    const org = await Organisation.findOne({ where: { name: d.organisation, kind: 'garage' }, transaction: t })
    if (!org) continue
    const bytes = tinyPdf(d.lines)
    let row = await ProofDocument.findOne({ where: { organisationId: org.id }, transaction: t })
    row ??= await ProofDocument.create({
      organisationId: org.id, storedName: `${createHash('sha256').update(`demo-proof:${d.organisation}`).digest('hex').slice(0, 32)}.pdf`, originalName: d.originalName, mime: 'application/pdf', sizeBytes: bytes.length,
    }, { transaction: t })
    const path = proofPath(uploadsDir, row.storedName)
    if (!existsSync(path)) {
      await writeFile(path, bytes)
      written++
    }
  }
  log(`proof documents: ${DOCS.length} on file (${written} written)`)
}
