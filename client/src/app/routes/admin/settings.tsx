import { useQuery } from '@tanstack/react-query'
import { SettingsForm } from '../../../features/settings/components/settings-form'
import { shopSettingsOptions } from '../../../lib/shop-settings'

export function Component() {
  const settings = useQuery(shopSettingsOptions())
  return (
    <div className="space-y-6">
      <h1 className="text-3xl font-bold">Settings</h1>
      {settings.isError ? (
        <p role="alert" className="text-red-700">
          {settings.error.message}
        </p>
      ) : settings.data ? (
        <SettingsForm settings={settings.data} />
      ) : (
        <p className="text-stone-500">Loading the settings…</p>
      )}
    </div>
  )
}
