/** Revision codes run A, B, … Z, AA, AB, … like spreadsheet columns. */
export function nextRevisionCode(existing: string[]): string {
  const toNumber = (code: string) => [...code].reduce((n, ch) => n * 26 + (ch.charCodeAt(0) - 64), 0)
  const highest = Math.max(0, ...existing.filter((c) => /^[A-Z]+$/.test(c)).map(toNumber))
  let n = highest + 1
  let code = ''
  while (n > 0) {
    const r = (n - 1) % 26
    code = String.fromCharCode(65 + r) + code
    n = Math.floor((n - 1) / 26)
  }
  return code
}
