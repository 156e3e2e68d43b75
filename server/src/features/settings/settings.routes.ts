import { UpdateShopIdentitySchema, UpdateShopSettingsSchema } from '@kitwright/shared/settings'
import type { Deps } from '../../deps'
import { auditContext, recordAudit } from '../../lib/audit'
import type { RouteTable } from '../../lib/routes'
import { getShopIdentity, getShopSettings, updateShopIdentity, updateShopSettings, type IdentityEnvironment } from './settings.service'

export function settingsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/settings')
  const env = (): IdentityEnvironment => ({ publicUrl: deps.publicUrl, mailFrom: deps.mail.from })
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
  // The shop's identity holds its mail sender and addresses: the owner's page only.
  r.get('/identity', ['admin'], async (_req, res) => {
    res.json(await getShopIdentity(deps.db, env()))
  })
  r.put('/identity', ['admin'], async (req, res) => {
    res.json(await updateShopIdentity(deps.db, UpdateShopIdentitySchema.parse(req.body), env(), auditContext(req)))
  })
  return r
}
