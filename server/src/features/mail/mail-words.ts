/** Small helpers every customer e-mail shares: HTML escaping, the first name, the date as written in a letter. */

export function escapeHtml(text: string) {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!)
}

/** The first word of the customer's name, to greet them by. */
export function firstNameOf(customerName: string) {
  return customerName.trim().split(/\s+/)[0] || customerName
}

/** The words and both bodies of one e-mail. */
export interface MailContent {
  subject: string
  text: string
  html: string
}
