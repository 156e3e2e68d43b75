/** A bench whose screens are not built yet says so plainly rather than showing an empty page. */
export function BenchNotReady({ bench, what }: { bench: string; what: string }) {
  return (
    <div className="space-y-4">
      <h1 className="text-4xl font-bold">{bench}</h1>
      <p className="rounded-lg border-2 border-amber-400 bg-amber-50 p-6 text-xl">
        This bench is not set up in Kitwright yet. When it is, you will {what} here.
      </p>
    </div>
  )
}
