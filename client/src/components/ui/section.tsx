import type { ReactNode } from 'react'

/** A titled panel of a page. */
export function Section({ title, actions, children, id }: { title: string; actions?: ReactNode; children: ReactNode; id?: string }) {
  return (
    <section aria-labelledby={id} className="space-y-3 rounded-lg border border-stone-300 bg-white p-4">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id={id} className="text-xl font-bold">
          {title}
        </h2>
        {actions}
      </div>
      {children}
    </section>
  )
}

/** A safety caution, shown where the work happens. */
export function Caution({ children }: { children: ReactNode }) {
  return (
    <p className="flex gap-2 rounded-md border-l-4 border-amber-500 bg-amber-50 p-2 text-amber-950">
      <span aria-hidden className="font-bold">
        ⚠
      </span>
      <span>
        <span className="sr-only">Caution: </span>
        {children}
      </span>
    </p>
  )
}
