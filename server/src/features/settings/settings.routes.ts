import { UpdateShopSettingsSchema } from '@kitwright/shared/settings'
import type { Deps } from '../../deps'
import type { RouteTable } from '../../lib/routes'
import { getShopSettings, updateShopSettings } from './settings.service'

export function settingsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/settings')
  // Every bench shows lengths in the shop's unit, so every signed-in user reads the settings.
  r.get('/', 'signed-in', async (_req, res) => {
    res.json(await getShopSettings(deps.db))
  })
  r.patch('/', ['admin'], async (req, res) => {
    res.json(await updateShopSettings(deps.db, UpdateShopSettingsSchema.parse(req.body)))
  })
  return r
}
