function escapeHtml(text: string) {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!)
}

export interface ShippedMailInput {
  shopName: string
  customerName: string
  orderNumber: string
  carrier: string
  service: string
  trackingNumber: string
  /** `recordUrl`: the customer's signed link to the unit's build record, or null for a spare-parts pack. */
  units: { serial: string; description: string; recordUrl: string | null }[]
  backOrdered: string[]
  /** Whether the parcel holds a part that runs on mains power: only then does the e-mail repeat the electrical cautions. */
  electrical: boolean
}

const ELECTRICAL_NOTE =
  'Before you fill the tote and plug in the pump, read the care and safety sheet in the box: ground-fault protected outlet only, a drip loop in the cord, and unplug before reaching into the water.'
const CARE_NOTE = 'Before you fill the tote, read the care sheet in the box.'

/** The words of the "shipped" e-mail: tracking number, what is in the parcel with links to each build record, what follows. */
export function shippedMailContent(input: ShippedMailInput) {
  const firstName = input.customerName.split(/\s+/)[0] ?? input.customerName
  const partial = input.backOrdered.length > 0
  const subject = `${input.shopName}: ${partial ? 'part of ' : ''}your order ${input.orderNumber} has shipped`
  const lines = input.units.map((u) => `  ${u.description}${u.recordUrl ? `\n    Build record (steps, photos, leak test): ${u.recordUrl}` : ''}`)
  const later = partial ? ['', `The rest (${input.backOrdered.join(', ')}) follows in a later parcel; we will write again when it ships.`] : []
  const text = [
    `Hello ${firstName},`,
    '',
    `Your order ${input.orderNumber} is on its way with ${input.carrier} (${input.service}).`,
    `Tracking number: ${input.trackingNumber}`,
    '',
    'In the parcel:',
    ...lines,
    ...later,
    '',
    input.electrical ? ELECTRICAL_NOTE : CARE_NOTE,
    '',
    `The ${input.shopName} workshop`,
  ].join('\n')
  const items = input.units
    .map(
      (u) => `<li>${escapeHtml(u.description)}${u.recordUrl ? ` — <a href="${escapeHtml(u.recordUrl)}">build record of ${escapeHtml(u.serial)}</a>` : ''}</li>`,
    )
    .join('')
  const html = [
    `<p>Hello ${escapeHtml(firstName)},</p>`,
    `<p>Your order <strong>${escapeHtml(input.orderNumber)}</strong> is on its way with ${escapeHtml(input.carrier)} (${escapeHtml(input.service)}).<br>Tracking number: <strong>${escapeHtml(input.trackingNumber)}</strong></p>`,
    `<p>In the parcel:</p><ul>${items}</ul>`,
    partial ? `<p>The rest (${escapeHtml(input.backOrdered.join(', '))}) follows in a later parcel; we will write again when it ships.</p>` : '',
    `<p>${input.electrical ? ELECTRICAL_NOTE : CARE_NOTE}</p>`,
    `<p>The ${escapeHtml(input.shopName)} workshop</p>`,
  ].join('\n')
  return { subject, text, html }
}
