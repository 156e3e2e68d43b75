import { useQuery } from '@tanstack/react-query'
import { useState } from 'react'
import { meOptions } from '../../../features/auth/api/auth-queries'
import { unitWeightsOptions } from '../../../features/unit-weights/api/unit-weight-queries'
import { UnitWeightsList } from '../../../features/unit-weights/components/unit-weights-list'

/** Unit weights of the small parts, from counted samples: what the pack bench checks hardware bags against. */
export function Component() {
  const me = useQuery(meOptions())
  const list = useQuery(unitWeightsOptions())
  const [editing, setEditing] = useState<string | null>(null)
  const canEdit = me.data?.role === 'admin' || me.data?.role === 'planner'
  return (
    <div className="space-y-4">
      <h1 className="text-3xl font-bold">Unit weights</h1>
      <p className="max-w-3xl text-base text-stone-700">
        The pack bench checks each hardware bag by weight: what it should weigh is the sum of its parts' unit weights, and it may be off by the larger
        of the parts' summed spread and half the lightest part, so one missing part is caught. Weigh a counted sample of each small part on a scale
        reading to 0.1 g or better; 1 lb = 453.59237 g and 1 oz = 28.349523125 g (NIST Handbook 44).
      </p>
      {list.isError && <p role="alert" className="text-red-700">{list.error.message}</p>}
      {list.data && <UnitWeightsList parts={list.data} editing={editing} onEdit={setEditing} canEdit={canEdit} />}
    </div>
  )
}
