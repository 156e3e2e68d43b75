import { UpdateShopSettingsSchema } from '@kitwright/shared/settings'
import type { Deps } from '../../deps'
import { auditContext, recordAudit } from '../../lib/audit'
import type { RouteTable } from '../../lib/routes'
import { getShopSettings, updateShopSettings } from './settings.service'

export function settingsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/settings')
  // Every bench shows lengths in the shop's unit, so every signed-in user reads the settings.
  r.get('/', 'signed-in', async (_req, res) => {
    res.json(await getShopSettings(deps.db))
  })
  r.patch('/', ['admin'], async (req, res) => {
    const change = UpdateShopSettingsSchema.parse(req.body)
    const settings = await updateShopSettings(deps.db, change)
    await recordAudit(deps.db, auditContext(req), { action: 'settings.update', entityType: 'settings', summary: `Changed shop settings: ${Object.keys(change).join(', ')}`, data: change })
    res.json(settings)
  })
  return r
}
