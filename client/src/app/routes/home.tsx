import { useQuery } from '@tanstack/react-query'
import { meOptions } from '../../features/auth/api/auth-queries'

export function Component() {
  const { data: me } = useQuery(meOptions())
  return (
    <div className="space-y-4">
      <h1 className="text-3xl font-bold">Good day, {me?.name.split(' ')[0]}</h1>
      <section className="rounded-lg border border-stone-300 bg-white p-6">
        <h2 className="text-xl font-bold">Shop overview</h2>
        <p className="mt-2 text-stone-700">
          Late orders, work in progress by bench, shortages and yields will show here once orders flow into Kitwright.
        </p>
      </section>
    </div>
  )
}
