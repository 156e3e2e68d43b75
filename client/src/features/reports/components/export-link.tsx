/** A download link to a report's CSV (a plain link: the browser sends the session cookie). */
export function ExportLink({ href, label }: { href: string; label: string }) {
  return (
    <a href={href} download className="inline-flex h-9 items-center rounded-md border border-stone-300 bg-white px-3 text-sm font-bold text-stone-900 hover:bg-stone-50">
      Export CSV<span className="sr-only"> of {label}</span>
    </a>
  )
}
