/**
 * Declining safety work, on record: the plain statement the owner reads before declining a line marked
 * required, and the words they sign. The owner's page shows exactly this text and the server stores exactly
 * this text with the signature, so the record says what the owner was shown.
 */

/** What the owner confirms, above their typed name. */
export const DECLINE_ACKNOWLEDGEMENT = 'I have read this. I do not want this work done now, and I understand that the vehicle keeps this fault until it is put right.'

/** The plain statement of what declining one required line means, from the line and the finding behind it. */
export function declineStatement(line: { description: string; reason: string | null }): string {
  const found = line.reason?.trim()
  return [
    `You are declining: ${line.description}.`,
    found ? `What we found: ${found}` : '',
    'The garage marked this work as required because the fault makes the brakes unsafe or would fail the roadworthiness test.',
    'If it is not done, the vehicle goes back to you with this fault: it may take longer to stop, pull to one side under braking, or the brakes may fail without warning, and it gets worse with use.',
    'We advise you not to drive the vehicle until the work is done.',
    'Your decision is kept with this quote and with the vehicle\'s record at the garage.',
  ].filter(Boolean).join(' ')
}

/** The statement and the confirmation together: what is stored with the signature. */
export function signedDeclineText(line: { description: string; reason: string | null }): string {
  return `${declineStatement(line)}\n${DECLINE_ACKNOWLEDGEMENT}`
}
