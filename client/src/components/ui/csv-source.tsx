import { Button } from './button'

interface Props {
  csv: string
  onCsvChange: (csv: string) => void
  /** Check the file on the server; nothing is stored. */
  onPreview: (csv: string) => void
  previewing: boolean
  /** Store it; offered only once a preview found nothing to fix. */
  onImport: () => void
  canImport: boolean
}

/** Where an import's CSV comes from (a file or pasted text), with Preview and Import. */
export function CsvSource({ csv, onCsvChange, onPreview, previewing, onImport, canImport }: Props) {
  return (
    <>
      <label className="block space-y-1">
        <span className="block text-sm font-bold text-stone-700">CSV file</span>
        <input
          type="file"
          accept=".csv,text/csv"
          className="block"
          onChange={async (e) => {
            const file = e.target.files?.[0]
            if (!file) return
            const text = await file.text()
            onCsvChange(text)
            onPreview(text)
          }}
        />
      </label>
      <label className="block space-y-1">
        <span className="block text-sm font-bold text-stone-700">…or paste it here</span>
        <textarea
          value={csv}
          onChange={(e) => onCsvChange(e.target.value)}
          rows={6}
          spellCheck={false}
          className="w-full rounded-md border border-stone-300 p-2 font-mono text-sm focus:outline-2 focus:outline-brand-600"
        />
      </label>
      <div className="flex flex-wrap gap-3">
        <Button variant="secondary" disabled={csv.trim() === '' || previewing} onClick={() => onPreview(csv)}>
          Preview
        </Button>
        <Button disabled={!canImport} onClick={onImport}>
          Import
        </Button>
      </div>
    </>
  )
}
