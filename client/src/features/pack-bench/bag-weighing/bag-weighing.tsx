import { useQuery } from '@tanstack/react-query'
import { useRef, useState, type FormEvent } from 'react'
import type { BagCheck, BagWeighing as Weighing } from '@kitwright/shared/bag-weights'
import { formatGrams, formatWeightBoth, parseWeight } from '@kitwright/shared/domain/bag-weight'
import { Button } from '../../../components/ui/button'
import { cn } from '../../../lib/cn'
import { ApiError } from '../../../lib/api-client'
import { bagChecksOptions, bagLabelHref, useWeighBag } from './bag-queries'
import { readSteadyWeight, scaleReadingSupported } from './web-serial-scale'

/**
 * The pack bench's scale: each hardware bag (or spare pack) of the open order with its contents, what
 * it should weigh and why, and a weight to enter — typed, or read from a USB scale where the browser
 * can (Web Serial). A bag outside its tolerance is refused with the parts most likely missing or extra.
 */
export function BagWeighing({ orderId, open }: { orderId: string; open: boolean }) {
  const checks = useQuery(bagChecksOptions(orderId))
  if (checks.isError)
    return (
      <p role="alert" className="text-xl text-red-700">
        {checks.error.message}
      </p>
    )
  if (!checks.data || checks.data.length === 0) return null
  return (
    <section aria-label="Weigh the bags" className="space-y-3">
      <h2 className="text-2xl font-bold">Weigh the bags</h2>
      {checks.data.map((bag) => (
        <BagRow key={bag.itemKey} orderId={orderId} bag={bag} open={open} />
      ))}
    </section>
  )
}

function BagRow({ orderId, bag, open }: { orderId: string; bag: BagCheck; open: boolean }) {
  const weigh = useWeighBag(orderId)
  const [text, setText] = useState('')
  const [source, setSource] = useState<'typed' | 'scale'>('typed')
  const [problem, setProblem] = useState<string | null>(null)
  const [reading, setReading] = useState(false)
  const abort = useRef<AbortController | null>(null)
  const last = bag.lastWeighing
  const kind = bag.itemKey.startsWith('pack:') ? 'Pack' : 'Bag'
  const label = `${kind} ${bag.serial}`

  async function submit(e: FormEvent) {
    e.preventDefault()
    setProblem(null)
    const parsed = parseWeight(text)
    if (!parsed.ok) {
      setProblem(parsed.message)
      return
    }
    try {
      await weigh.mutateAsync({ itemKey: bag.itemKey, weight: text, source })
      setText('')
      setSource('typed')
    } catch (err) {
      setProblem(err instanceof ApiError ? (err.body.fields?.weight ?? err.message) : err instanceof Error ? err.message : String(err))
    }
  }

  async function readScale() {
    setProblem(null)
    abort.current = new AbortController()
    setReading(true)
    try {
      setText(await readSteadyWeight(abort.current.signal))
      setSource('scale')
    } catch (err) {
      setProblem(`${err instanceof Error ? err.message : String(err)}. Type the weight instead.`)
    } finally {
      setReading(false)
    }
  }

  return (
    <div
      aria-label={`Weigh ${label}`}
      className={cn(
        'space-y-2 rounded-lg border-2 p-3',
        last ? (last.accepted ? 'border-green-700 bg-green-50' : 'border-red-700 bg-red-50') : 'border-stone-300 bg-white',
      )}
    >
      <p className="text-xl font-bold">
        {label} ·{' '}
        {bag.lines
          .filter((l) => !l.isBag)
          .map((l) => `${l.quantity} × ${l.name}`)
          .join(', ')}
      </p>
      {bag.problem && <p className="text-lg font-bold text-red-800">{bag.problem}</p>}
      {bag.expectation && (
        <>
          <p className="text-2xl">
            Should weigh <strong>{formatWeightBoth(bag.expectation.expectedMg)}</strong> ± {formatGrams(bag.expectation.toleranceMg)}
          </p>
          <ul aria-label={`Why ${label} should weigh this`} className="list-disc pl-6 text-base text-stone-700">
            {bag.expectation.reasoning.map((r) => (
              <li key={r} className={r.startsWith('Caution') ? 'font-bold text-amber-800' : undefined}>
                {r}
              </li>
            ))}
          </ul>
        </>
      )}
      {last && <LastWeighing weighing={last} orderId={orderId} itemKey={bag.itemKey} />}
      {open && bag.expectation && (
        <form onSubmit={(e) => void submit(e)} className="flex flex-wrap items-end gap-3">
          <label className="block">
            <span className="block text-base font-bold">Weight of {label} on the scale</span>
            <input
              value={text}
              onChange={(e) => {
                setText(e.target.value)
                setSource('typed')
              }}
              inputMode="decimal"
              autoComplete="off"
              placeholder="e.g. 127.4 g or 4.5 oz"
              aria-invalid={problem !== null}
              className="h-14 w-64 rounded-md border-2 border-stone-400 bg-white px-3 text-2xl"
            />
          </label>
          <Button size="bench" type="submit" disabled={weigh.isPending || text.trim() === ''}>
            Weigh {kind.toLowerCase()}
          </Button>
          {scaleReadingSupported() &&
            (reading ? (
              <Button size="bench" variant="secondary" onClick={() => abort.current?.abort()}>
                Stop reading
              </Button>
            ) : (
              <Button size="bench" variant="secondary" onClick={() => void readScale()}>
                Read the scale
              </Button>
            ))}
        </form>
      )}
      {problem && (
        <p role="alert" className="text-lg font-bold text-red-800">
          {problem}
        </p>
      )}
    </div>
  )
}

function LastWeighing({ weighing, orderId, itemKey }: { weighing: Weighing; orderId: string; itemKey: string }) {
  const at = new Date(weighing.weighedAt).toLocaleTimeString([], { hour: '2-digit', minute: '2-digit' })
  return (
    <div role={weighing.accepted ? 'status' : 'alert'} className={cn('space-y-1 text-lg', weighing.accepted ? 'text-green-900' : 'text-red-900')}>
      <p className="text-xl font-bold">{weighing.words}</p>
      {!weighing.accepted && weighing.explanations.length > 0 && <p>Open the bag, put right what is named, and weigh it again.</p>}
      <p className="text-base">
        {weighing.enteredAs} ({weighing.source === 'scale' ? 'read from the scale' : 'typed'}) by {weighing.weighedBy.name} at {at}
      </p>
      {weighing.accepted && (
        <a
          href={bagLabelHref(orderId, itemKey)}
          target="_blank"
          rel="noreferrer"
          className="inline-flex h-14 items-center rounded-md border border-stone-300 bg-white px-6 text-lg font-bold text-stone-900"
        >
          Print bag label (2 × 1 in)
        </a>
      )}
    </div>
  )
}
