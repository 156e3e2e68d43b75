import { MAIL_STATUS_LABELS, type MailStatus } from '@kitwright/shared/mail'
import { cn } from '../../../lib/cn'

const TONE: Record<MailStatus, string> = {
  queued: 'bg-amber-100 text-amber-950',
  sent: 'bg-brand-100 text-brand-900',
  failed: 'bg-red-100 text-red-900',
}

export function MailStatusBadge({ status }: { status: MailStatus }) {
  return <span className={cn('rounded px-2 py-0.5 text-sm font-bold', TONE[status])}>{MAIL_STATUS_LABELS[status]}</span>
}
