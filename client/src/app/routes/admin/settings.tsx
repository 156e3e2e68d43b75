import { useQuery } from '@tanstack/react-query'
import { shopIdentityOptions } from '../../../features/settings/api/identity-queries'
import { ReturnReasonsEditor } from '../../../features/returns/components/return-reasons-editor'
import { IdentityForm } from '../../../features/settings/components/identity-form'
import { SettingsForm } from '../../../features/settings/components/settings-form'
import { shopSettingsOptions } from '../../../lib/shop-settings'

export function Component() {
  const settings = useQuery(shopSettingsOptions())
  const identity = useQuery(shopIdentityOptions())
  return (
    <div className="space-y-10">
      <h1 className="text-3xl font-bold">Settings</h1>
      {identity.isError ? (
        <p role="alert" className="text-red-700">
          {identity.error.message}
        </p>
      ) : identity.data ? (
        <IdentityForm identity={identity.data} />
      ) : (
        <p className="text-stone-500">Loading the shop identity…</p>
      )}
      {settings.isError ? (
        <p role="alert" className="text-red-700">
          {settings.error.message}
        </p>
      ) : settings.data ? (
        <SettingsForm settings={settings.data} />
      ) : (
        <p className="text-stone-500">Loading the settings…</p>
      )}
      <ReturnReasonsEditor />
    </div>
  )
}
