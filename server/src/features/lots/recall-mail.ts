import { escapeHtml, firstNameOf, type MailContent } from '../mail/mail-words'

/** The outbox purpose of a lot's recall notice (one per customer and lot; see lot_recall_notices). */
export function recallPurpose(lotId: string) {
  return `lot_recall:${lotId}`
}

/** The usual cautions for a mains-powered part in water; they defer to local codes and licensed practice. */
const ELECTRICAL_CAUTION =
  'Before you touch the water or the unit, switch off and unplug the pump at the outlet (a ground-fault protected outlet, with a drip loop on the cord). Follow your local electrical codes; if in doubt, ask a licensed electrician.'

/**
 * The words of a recall notice to one customer: which part and lot, which of their units have it
 * (shipped ones, and ones still in the workshop that will not leave with it), and what the shop asks
 * them to do, in the shop's own words.
 */
export function recallNoticeContent(input: {
  shopName: string
  customerName: string
  part: { sku: string; name: string; electrical: boolean }
  lotCode: string
  units: { serial: string; orderNumber: string; kitName: string; shipped: boolean }[]
  message: string
}): MailContent {
  const firstName = firstNameOf(input.customerName)
  const subject = `${input.shopName}: a notice about the ${input.part.name} in your order${input.units.length > 1 ? 's' : ''} (lot ${input.lotCode})`
  const shipped = input.units.filter((u) => u.shipped)
  const here = input.units.filter((u) => !u.shipped)
  const line = (u: (typeof input.units)[number]) => `${u.kitName}, serial ${u.serial} (order ${u.orderNumber})`
  const opening = `One of the parts we fitted, ${input.part.name} (${input.part.sku}), came from the supplier's lot ${input.lotCode}, and we are checking that lot.`
  const text = [
    `Hello ${firstName},`,
    '',
    opening,
    ...(shipped.length ? ['', 'It is in the unit(s) we sent you:', ...shipped.map((u) => `  ${line(u)}`)] : []),
    ...(here.length
      ? ['', 'These unit(s) are still in our workshop; we will not ship them with a part from that lot:', ...here.map((u) => `  ${line(u)}`)]
      : []),
    '',
    input.message,
    ...(input.part.electrical && shipped.length ? ['', ELECTRICAL_CAUTION] : []),
    '',
    'Reply to this e-mail with any question.',
    '',
    `The ${input.shopName} workshop`,
  ].join('\n')
  const list = (units: typeof input.units) => `<ul>${units.map((u) => `<li>${escapeHtml(line(u))}</li>`).join('')}</ul>`
  const html = [
    `<p>Hello ${escapeHtml(firstName)},</p>`,
    `<p>${escapeHtml(opening)}</p>`,
    ...(shipped.length ? ['<p>It is in the unit(s) we sent you:</p>', list(shipped)] : []),
    ...(here.length ? ['<p>These unit(s) are still in our workshop; we will not ship them with a part from that lot:</p>', list(here)] : []),
    `<p>${escapeHtml(input.message).replace(/\n/g, '<br>')}</p>`,
    ...(input.part.electrical && shipped.length ? [`<p><strong>${escapeHtml(ELECTRICAL_CAUTION)}</strong></p>`] : []),
    '<p>Reply to this e-mail with any question.</p>',
    `<p>The ${escapeHtml(input.shopName)} workshop</p>`,
  ].join('\n')
  return { subject, text, html }
}
