/** The words of the e-mails about what a garage owes: the monthly statement and an overdue reminder. Plain Node. */
import type { Formats } from '../../../shared/utils/format'
import type { OpenItem } from '../../../shared/types/money-owed'

export function statementMail(garage: string, month: string, balanceMinor: number, overdueMinor: number, link: string, fmt: Formats) {
  const m = fmt.money
  return {
    subject: `Your statement for ${fmt.month(month)}`,
    text: [
      `Hello ${garage},`, '',
      `Your trade account statement for ${fmt.month(month)} is attached as a PDF.`,
      `Balance now: ${m(balanceMinor)}.${overdueMinor > 0 ? ` Of this, ${m(overdueMinor)} is overdue.` : ''}`, '',
      `Read it, download it or pay by card at ${link}`,
    ].join('\n'),
  }
}

export function overdueMail(garage: string, items: readonly { item: OpenItem; days: number }[], link: string, fmt: Formats) {
  const m = fmt.money
  const total = items.reduce((s, i) => s + i.item.openMinor, 0)
  return {
    subject: `Overdue on your trade account: ${m(total)}`,
    text: [
      `Hello ${garage},`, '',
      'These items on your trade account are past their due date:',
      ...items.map(({ item }) => `- ${item.invoice ?? item.reference}: ${m(item.openMinor)} still open, due ${item.dueOn ? fmt.day(`${item.dueOn}T12:00:00Z`) : ''}, ${item.daysOverdue} days overdue`),
      '', `Together: ${m(total)}. Please pay by transfer or by card at ${link}`,
      'If you have already paid, thank you, and please ignore this reminder.',
    ].join('\n'),
  }
}
