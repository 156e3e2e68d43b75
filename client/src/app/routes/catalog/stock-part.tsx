import { useQuery } from '@tanstack/react-query'
import { Link, useParams } from 'react-router-dom'
import { paths } from '../../../config/paths'
import { stockLedgerOptions } from '../../../features/stock/api/stock-queries'
import { AdjustForm } from '../../../features/stock/components/adjust-form'
import { StockLedgerView } from '../../../features/stock/components/stock-ledger'

export function Component() {
  const { partId = '' } = useParams()
  const ledger = useQuery(stockLedgerOptions(partId))
  const part = ledger.data?.balance
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="mr-auto text-3xl font-bold">{part ? `${part.sku} — ${part.name}` : 'Stock ledger'}</h1>
        <Link to={paths.stock.href()} className="font-bold text-brand-700 hover:underline">
          Back to stock
        </Link>
      </div>
      {ledger.isError && (
        <p role="alert" className="text-red-700">
          {ledger.error.message}
        </p>
      )}
      {ledger.data && (
        <>
          <section className="space-y-2">
            <h2 className="text-xl font-bold">Adjust</h2>
            <AdjustForm key={ledger.data.balance.partId} part={ledger.data.balance} lots={ledger.data.lots} />
          </section>
          <section className="space-y-2">
            <h2 className="text-xl font-bold">Ledger</h2>
            <StockLedgerView ledger={ledger.data} />
          </section>
        </>
      )}
    </div>
  )
}
