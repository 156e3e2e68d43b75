/**
 * Codes a keyboard-wedge scanner types while no scan field is on screen yet: the bench page is
 * still loading (after a tap on the menu, after signing in), so there is nothing to type into and
 * the keys would be lost. They are kept here, and the next scan field to appear takes them
 * (`ScanField`): whole codes (ended by Enter) are handled in order, a code cut off mid-way is
 * finished in the field.
 *
 * Only fresh keys count: a wedge scanner types a code in a fraction of a second (common practice),
 * so keys more than KEY_GAP_MS apart start a new code, and codes older than KEEP_MS when a field
 * appears are dropped (they were typed on some other page, not meant as scans).
 */
export const KEY_GAP_MS = 1000
export const KEEP_MS = 5000

const NOT_TYPED = new Set(['checkbox', 'radio', 'button', 'submit', 'reset', 'file', 'image', 'range', 'color'])

/** The focused element takes typing itself (a text field, a list): its keys are not ours. */
function typingTarget(el: Element | null): boolean {
  if (el instanceof HTMLTextAreaElement || el instanceof HTMLSelectElement) return true
  if (el instanceof HTMLElement && el.isContentEditable) return true
  return el instanceof HTMLInputElement && !NOT_TYPED.has(el.type)
}

let partial = ''
let lastKeyAt = 0
let codes: { code: string; at: number }[] = []
let fieldsOnScreen = 0

function onKeyDown(e: KeyboardEvent, now: number) {
  if (fieldsOnScreen > 0 || e.ctrlKey || e.metaKey || e.altKey || typingTarget(document.activeElement)) return
  if (now - lastKeyAt > KEY_GAP_MS) partial = ''
  lastKeyAt = now
  if (e.key === 'Enter') {
    const code = partial.trim()
    partial = ''
    if (code) codes.push({ code, at: now })
  } else if (e.key.length === 1) {
    partial += e.key
  }
}

/** Listens from the app's start; `clock` is for tests. Returns the way to stop listening. */
export function keepEarlyScans(clock: () => number = Date.now): () => void {
  const listener = (e: KeyboardEvent) => onKeyDown(e, clock())
  document.addEventListener('keydown', listener, true)
  return () => document.removeEventListener('keydown', listener, true)
}

/**
 * A scan field appeared: it takes what was typed before it (and keys go to it, not here, until it
 * goes). Call the returned function when the field goes.
 */
export function takeEarlyScans(clock: () => number = Date.now): { codes: string[]; partial: string; release: () => void } {
  const now = clock()
  const fresh = codes.filter((c) => now - c.at <= KEEP_MS).map((c) => c.code)
  const cutOff = now - lastKeyAt <= KEY_GAP_MS ? partial : ''
  codes = []
  partial = ''
  fieldsOnScreen++
  let released = false
  return {
    codes: fresh,
    partial: cutOff,
    release: () => {
      if (released) return
      released = true
      fieldsOnScreen--
    },
  }
}
