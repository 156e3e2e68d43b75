/**
 * GS1 identification keys for parcels: the mod-10 check digit of every GS1 key, the Serial Shipping
 * Container Code (SSCC-18) and its GS1-128 element string with application identifier (00).
 *
 * Check digit: GS1 General Specifications, §7.9.1 "Standard check digit calculations for GS1 data
 * structures". Weights 3 and 1 alternate from the rightmost digit of the key without its check
 * digit; the check digit brings the weighted sum up to the next multiple of ten.
 *
 * SSCC: GS1 General Specifications, §2.2 (logistic units) and §3.3.1 (AI 00): extension digit (1),
 * GS1 Company Prefix and serial reference (16 digits between them), check digit (1).
 */

/** Digits in an SSCC, check digit included. */
export const SSCC_LENGTH = 18

/** The application identifier that marks an SSCC in a GS1-128 element string. */
export const SSCC_AI = '00'

/** A GS1 Company Prefix is 4 to 12 digits long (GS1 General Specifications, §1.4.4). */
export const COMPANY_PREFIX_MIN_LENGTH = 4
/** A GS1 Company Prefix is 4 to 12 digits long (GS1 General Specifications, §1.4.4). */
export const COMPANY_PREFIX_MAX_LENGTH = 12

const DIGITS = /^[0-9]+$/

/**
 * The GS1 mod-10 check digit of `digits` (a GS1 key without its check digit, any length):
 * from the right, digits are weighted 3, 1, 3, 1 …; the check digit is what brings the sum to the next
 * multiple of ten (GS1 General Specifications §7.9.1).
 */
export function gs1CheckDigit(digits: string): number {
  if (!DIGITS.test(digits)) throw new Error(`A GS1 key is digits only: "${digits}" has something else in it`)
  let sum = 0
  for (let i = 0; i < digits.length; i++) {
    const digit = digits.charCodeAt(digits.length - 1 - i) - 48
    sum += digit * (i % 2 === 0 ? 3 : 1)
  }
  return (10 - (sum % 10)) % 10
}

/** Whether a whole GS1 key (its last digit the check digit) is consistent. */
export function hasValidCheckDigit(key: string): boolean {
  if (key.length < 2 || !DIGITS.test(key)) return false
  return gs1CheckDigit(key.slice(0, -1)) === Number(key.at(-1))
}

/** What an SSCC is built from: the shop's choice of extension digit, its licensed prefix and a serial. */
export interface SsccParts {
  /** 0 to 9, chosen by the company to widen its serial range. */
  extensionDigit: number
  /** The GS1 Company Prefix, 4 to 12 digits (as licensed; leading zeros count). */
  companyPrefix: string
  /** A whole number, unique per logistic unit under this prefix; zero-padded to fill the SSCC. */
  serialReference: number
}

/** A problem with SSCC parts, in words a person can fix, or null when they make an SSCC. */
export function ssccProblem(parts: SsccParts): string | null {
  const { extensionDigit, companyPrefix, serialReference } = parts
  if (!Number.isInteger(extensionDigit) || extensionDigit < 0 || extensionDigit > 9) return 'The SSCC extension digit must be one digit, 0 to 9'
  if (!DIGITS.test(companyPrefix) || companyPrefix.length < COMPANY_PREFIX_MIN_LENGTH || companyPrefix.length > COMPANY_PREFIX_MAX_LENGTH) {
    return `The GS1 Company Prefix must be ${COMPANY_PREFIX_MIN_LENGTH} to ${COMPANY_PREFIX_MAX_LENGTH} digits; "${companyPrefix}" is not`
  }
  const room = SSCC_LENGTH - 2 - companyPrefix.length
  if (!Number.isSafeInteger(serialReference) || serialReference < 0) return 'The SSCC serial reference must be a whole number, zero or more'
  if (String(serialReference).length > room) {
    return `Serial reference ${serialReference} does not fit: a ${companyPrefix.length}-digit company prefix leaves ${room} digits for it`
  }
  return null
}

/**
 * The 18-digit SSCC: extension digit + company prefix + serial reference (zero-padded to fill) +
 * check digit. Throws with what to fix when the parts do not make one.
 */
export function sscc(parts: SsccParts): string {
  const problem = ssccProblem(parts)
  if (problem) throw new Error(problem)
  const room = SSCC_LENGTH - 2 - parts.companyPrefix.length
  const body = `${parts.extensionDigit}${parts.companyPrefix}${String(parts.serialReference).padStart(room, '0')}`
  return `${body}${gs1CheckDigit(body)}`
}

/** The GS1-128 element string of an SSCC, as printed under the bar code: `(00)` and the 18 digits. */
export function ssccElementString(ssccDigits: string): string {
  if (ssccDigits.length !== SSCC_LENGTH || !hasValidCheckDigit(ssccDigits)) throw new Error(`"${ssccDigits}" is not an 18-digit SSCC with a valid check digit`)
  return `(${SSCC_AI})${ssccDigits}`
}

/**
 * The SSCC as people read it on a label: extension digit, company prefix, serial reference and check
 * digit in groups (`1 0614141 123456789 7`), given the prefix length.
 */
export function formatSscc(ssccDigits: string, companyPrefixLength: number): string {
  const cut = 1 + companyPrefixLength
  return `${ssccDigits.slice(0, 1)} ${ssccDigits.slice(1, cut)} ${ssccDigits.slice(cut, 17)} ${ssccDigits.slice(17)}`
}
