import { useQuery } from '@tanstack/react-query'
import { Link } from 'react-router-dom'
import { Button } from '../../../components/ui/button'
import { Section } from '../../../components/ui/section'
import { paths } from '../../../config/paths'
import { mailListOptions, useResendMail } from '../api/mail-queries'

/**
 * E-mail that failed for good (its retries ran out while the relay was away), on the home page with
 * "Send again"; shows nothing when there is none. The periodic sweep also retries them by itself.
 */
export function FailedMailPanel() {
  const { data } = useQuery(mailListOptions({ status: 'failed', page: 1, pageSize: 10 }))
  const resend = useResendMail()
  if (!data || data.total === 0) return null
  return (
    <Section title={`E-mail that failed (${data.total})`} id="failed-mail">
      <ul className="space-y-2">
        {data.items.map((m) => (
          <li key={m.id} className="flex flex-wrap items-center gap-3">
            <span>
              {m.subject} — to {m.to}
            </span>
            <Button size="sm" disabled={resend.isPending} onClick={() => resend.mutate(m.id)}>
              Send again
            </Button>
          </li>
        ))}
      </ul>
      {resend.isError && <p role="alert" className="text-red-800">{resend.error.message}</p>}
      <Link className="text-brand-700 underline" to={paths.outbox.href()}>
        Open the outbox
      </Link>
    </Section>
  )
}
