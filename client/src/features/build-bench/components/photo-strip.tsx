import type { UnitPhoto } from '@kitwright/shared/build'
import { formatWhen } from './format'

/** Thumbnails of a unit's photos; each opens the full photo. */
export function PhotoStrip({ photos }: { photos: readonly UnitPhoto[] }) {
  if (photos.length === 0) return null
  return (
    <ul className="flex flex-wrap gap-3" aria-label="Photos">
      {photos.map((p) => (
        <li key={p.id} className="w-40 break-inside-avoid">
          {p.url ? (
            <a href={p.url} target="_blank" rel="noreferrer">
              <img src={p.url} alt={`Photo by ${p.by.name}, ${formatWhen(p.at)}`} className="h-28 w-40 rounded-md border border-stone-300 object-cover" />
            </a>
          ) : (
            <span className="flex h-28 w-40 items-center justify-center rounded-md border border-dashed border-stone-400 text-sm text-stone-500">Photo store not set up</span>
          )}
          <span className="block text-sm text-stone-600">
            {p.by.name}, {formatWhen(p.at)}
          </span>
        </li>
      ))}
    </ul>
  )
}
