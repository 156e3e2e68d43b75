import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import path from 'node:path'
import { dataDir } from './system.mjs'

/** Local secrets, made once per checkout and kept in the git-ignored .data/ folder. */
export function localSecret(name) {
  mkdirSync(dataDir, { recursive: true })
  const file = path.join(dataDir, `${name}.secret`)
  if (!existsSync(file)) writeFileSync(file, randomBytes(32).toString('base64url'), { mode: 0o600 })
  return readFileSync(file, 'utf8').trim()
}
