import { useState } from 'react'
import { useController, type Control, type FieldPath, type FieldValues } from 'react-hook-form'
import { Field, Input } from '../../../components/ui/field'

/** What a typed text means: a value for the form, or a message that says what to fix. */
export type TextParse<V> = { ok: true; value: V } | { ok: false; message: string }

interface Props<T extends FieldValues, N extends FieldPath<T>> {
  control: Control<T>
  name: N
  label: string
  hint?: string
  placeholder?: string
  /** The text shown for the field's starting value. */
  toText: (value: T[N]) => string
  parse: (text: string) => TextParse<T[N]>
}

/** The first message in a field's error; a list field's errors may sit on its items. */
function firstMessage(error: unknown): string | undefined {
  if (!error || typeof error !== 'object') return undefined
  if ('message' in error && typeof error.message === 'string' && error.message) return error.message
  for (const inner of Object.values(error)) {
    const found = inner && typeof inner === 'object' && !('ref' in inner && inner === error) ? firstMessage(inner) : undefined
    if (found) return found
  }
  return undefined
}

/**
 * A form field typed as text in human units (`10 ft`, `0.840 in`, `12.34`) and held in the form as
 * the number the shared schema wants. Text that cannot be read leaves the form value NaN, so the
 * form cannot be sent, and shows the parser's own message.
 */
export function ParsedTextField<T extends FieldValues, N extends FieldPath<T>>({ control, name, label, hint, placeholder, toText, parse }: Props<T, N>) {
  const { field, fieldState } = useController({ control, name })
  const [text, setText] = useState(() => toText(field.value))
  const [parseError, setParseError] = useState<string | null>(null)
  const error = parseError ?? firstMessage(fieldState.error)
  return (
    <Field label={label} hint={hint} error={error}>
      <Input
        ref={field.ref}
        name={field.name}
        value={text}
        placeholder={placeholder}
        aria-invalid={!!error}
        onBlur={field.onBlur}
        onChange={(e) => {
          setText(e.target.value)
          const r = parse(e.target.value)
          setParseError(r.ok ? null : r.message)
          field.onChange(r.ok ? r.value : Number.NaN)
        }}
      />
    </Field>
  )
}
