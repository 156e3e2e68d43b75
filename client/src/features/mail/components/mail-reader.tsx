import { formatDateTime } from '@kitwright/shared/dates'
import { useQuery } from '@tanstack/react-query'
import { Link } from 'react-router-dom'
import { Button } from '../../../components/ui/button'
import { Section } from '../../../components/ui/section'
import { paths } from '../../../config/paths'
import { mailMessageOptions, useResendMail } from '../api/mail-queries'
import { MailStatusBadge } from './mail-status-badge'

/** One message as the customer sees it: the HTML part in a sandboxed frame (no scripts, no links out), or the plain text. */
export function MailReader({ id, onClose }: { id: string; onClose: () => void }) {
  const { data: mail, isError, error } = useQuery(mailMessageOptions(id))
  const resend = useResendMail()
  return (
    <Section
      title={mail?.subject ?? 'Message'}
      id="mail-reader"
      actions={
        <Button size="sm" variant="secondary" onClick={onClose}>
          Close
        </Button>
      }
    >
      {isError && <p role="alert">{error.message}</p>}
      {mail && (
        <div className="space-y-3">
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
            <dt className="font-bold">To</dt>
            <dd>{mail.to}</dd>
            <dt className="font-bold">Status</dt>
            <dd className="flex flex-wrap items-center gap-2">
              <MailStatusBadge status={mail.status} />
              <span>
                {mail.attempts} {mail.attempts === 1 ? 'try' : 'tries'}
                {mail.sentAt ? `, sent ${formatDateTime(mail.sentAt)}` : ''}
              </span>
            </dd>
            {mail.lastError && (
              <>
                <dt className="font-bold">Last error</dt>
                <dd className="text-red-800">{mail.lastError}</dd>
              </>
            )}
            {mail.status === 'failed' && (
              <>
                <dt className="font-bold">Failed for good</dt>
                <dd className="flex flex-wrap items-center gap-2">
                  <Button size="sm" disabled={resend.isPending} onClick={() => resend.mutate(mail.id)}>
                    Send again
                  </Button>
                  {resend.isError && <span role="alert" className="text-red-800">{resend.error.message}</span>}
                </dd>
              </>
            )}
            {mail.order && (
              <>
                <dt className="font-bold">Order</dt>
                <dd>
                  <Link className="text-brand-700 underline" to={paths.order.href(mail.order.id)}>
                    {mail.order.number}
                  </Link>
                </dd>
              </>
            )}
          </dl>
          {mail.attachments.length > 0 && (
            <p className="text-stone-700">
              Attached: {mail.attachments.map((a) => `${a.filename} (${Math.max(1, Math.round(a.bytes / 1024))} kB)`).join(', ')}
            </p>
          )}
          {mail.html ? (
            <iframe title="Message as the customer sees it" sandbox="" srcDoc={mail.html} className="h-96 w-full rounded border border-stone-300 bg-white" />
          ) : (
            <pre className="whitespace-pre-wrap rounded border border-stone-300 bg-stone-50 p-3 font-sans">{mail.text}</pre>
          )}
          {mail.html && (
            <details>
              <summary className="cursor-pointer font-bold">Plain-text part</summary>
              <pre className="mt-2 whitespace-pre-wrap rounded border border-stone-300 bg-stone-50 p-3 font-sans">{mail.text}</pre>
            </details>
          )}
        </div>
      )}
    </Section>
  )
}
