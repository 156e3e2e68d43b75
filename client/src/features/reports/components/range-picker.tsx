import type { ReportRangeQuery } from '@kitwright/shared/reports'
import { Input } from '../../../components/ui/field'

/** The charts' range of days (UTC), both ends included; empty means the last 30 days. */
export function RangePicker({ value, onChange }: { value: ReportRangeQuery; onChange: (next: ReportRangeQuery) => void }) {
  return (
    <div className="flex flex-wrap items-end gap-3">
      <label className="block space-y-1">
        <span className="block text-sm font-bold text-stone-700">From (UTC)</span>
        <Input type="date" value={value.from ?? ''} onChange={(e) => onChange({ ...value, from: e.target.value || undefined })} className="w-44" />
      </label>
      <label className="block space-y-1">
        <span className="block text-sm font-bold text-stone-700">To (UTC)</span>
        <Input type="date" value={value.to ?? ''} onChange={(e) => onChange({ ...value, to: e.target.value || undefined })} className="w-44" />
      </label>
    </div>
  )
}
