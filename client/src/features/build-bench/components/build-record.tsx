import type { UnitRecord } from '@kitwright/shared/build'
import { WORK_ORDER_STATUS_LABELS } from '@kitwright/shared/status-words'
import { Button } from '../../../components/ui/button'
import { Section } from '../../../components/ui/section'
import './build-record.css'
import { formatWhen } from './format'
import { LeakTestList } from './leak-test-list'
import { PhotoStrip } from './photo-strip'
import { RecordPieces } from './record-pieces'
import { RecordSteps } from './record-steps'

/** Everything about one serial, read-only and printable. */
export function BuildRecord({ record }: { record: UnitRecord }) {
  const firstTest = record.leakTests[0]
  return (
    <article data-build-record className="space-y-5">
      <div className="flex flex-wrap items-baseline gap-x-6 gap-y-2">
        <h1 className="text-4xl font-bold">Build record · Unit {record.workOrder.serial}</h1>
        <Button variant="secondary" className="ml-auto print:hidden" onClick={() => window.print()}>
          Print
        </Button>
      </div>
      <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-1 text-lg">
        <dt className="font-bold">Kit</dt>
        <dd>
          {record.kit.sku} · {record.kit.name}
        </dd>
        <dt className="font-bold">Revision</dt>
        <dd>{record.revision.code}</dd>
        <dt className="font-bold">Order</dt>
        <dd>{record.order.number}</dd>
        <dt className="font-bold">Status</dt>
        <dd data-testid="unit-status">{WORK_ORDER_STATUS_LABELS[record.workOrder.status]}</dd>
        <dt className="font-bold">Leak test</dt>
        <dd>
          {firstTest
            ? `${record.leakTests.length} test${record.leakTests.length === 1 ? '' : 's'}; ${firstTest.passed ? 'passed at the first attempt' : 'failed at the first attempt'}`
            : record.leakTestProtocol
              ? 'not run yet'
              : 'none for this revision'}
        </dd>
      </dl>
      <Section title="Pipe pieces and their sticks" id="record-pieces">
        <RecordPieces record={record} />
      </Section>
      {record.lots.length > 0 && (
        <Section title="Parts by supplier's lot" id="record-lots">
          <ul className="space-y-2 text-lg" aria-label="Lots fitted">
            {record.lots.map((l) => (
              <li key={l.partId}>
                <strong>{l.name}</strong> ({l.sku}):{' '}
                {l.fitted.length === 0
                  ? 'no lot recorded'
                  : l.fitted.map((f, i) => (
                      <span key={f.id}>
                        {i > 0 && '; '}
                        {f.quantity} × lot <span className="font-mono font-bold">{f.lotCode}</span> — {f.by.name}, {formatWhen(f.at)}
                      </span>
                    ))}
                {l.left > 0 && l.fitted.length > 0 && `; ${l.left} without a lot yet`}
              </li>
            ))}
          </ul>
        </Section>
      )}
      <Section title="Build steps" id="record-steps">
        <RecordSteps record={record} />
      </Section>
      <Section title="Photos" id="record-photos">
        {record.photos.length > 0 ? <PhotoStrip photos={record.photos} /> : <p className="text-lg">No photos.</p>}
      </Section>
      <Section title="Leak tests" id="record-leak-tests">
        <LeakTestList tests={record.leakTests} />
      </Section>
      {record.rework.length > 0 && (
        <Section title="Rework" id="record-rework">
          <ul className="space-y-2">
            {record.rework.map((r) => (
              <li key={r.id} className="text-base">
                {r.reason} — {r.by.name}, {formatWhen(r.at)}
                {r.resolvedAt && r.resolvedBy && `; resolved by ${r.resolvedBy.name}, ${formatWhen(r.resolvedAt)}`}
              </li>
            ))}
          </ul>
        </Section>
      )}
    </article>
  )
}
