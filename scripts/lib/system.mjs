// Plain Node only: this file runs before `npm ci` on a fresh clone.
import { execFileSync, spawnSync } from 'node:child_process'
import { existsSync, statSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { fail, step } from './log.mjs'

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..')
export const dataDir = path.join(root, '.data')

export function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { stdio: 'inherit', cwd: root, ...opts })
  if (r.status !== 0) fail(`${cmd} ${args.join(' ')} failed (exit ${r.status ?? r.signal})`)
}

/** `npm ci` when node_modules is missing or older than package-lock.json. */
export function ensureNodeModules() {
  const marker = path.join(root, 'node_modules/.package-lock.json')
  const lock = path.join(root, 'package-lock.json')
  if (existsSync(marker) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs) return
  step('installing dependencies (npm ci)')
  run('npm', ['ci', '--no-audit', '--no-fund'])
}

function isRoot() {
  return typeof process.getuid === 'function' && process.getuid() === 0
}

/** Installs a Debian package when `present()` says it is missing. */
export function ensureAptPackage(pkg, present) {
  if (present()) return
  step(`installing ${pkg} from Debian's packages (apt-get)`)
  const sudo = isRoot() ? [] : ['sudo', '-n']
  const install = () =>
    spawnSync(sudo[0] ?? 'apt-get', [...sudo.slice(1), ...(sudo.length ? ['apt-get'] : []), 'install', '-y', '--no-install-recommends', pkg], {
      stdio: 'inherit',
      env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
    }).status === 0
  if (!install()) {
    spawnSync(sudo[0] ?? 'apt-get', [...sudo.slice(1), ...(sudo.length ? ['apt-get'] : []), 'update'], { stdio: 'inherit' })
    if (!install()) fail(`could not install ${pkg}; install it by hand (apt-get install ${pkg}) and run again`)
  }
  if (!present()) fail(`${pkg} was installed but is still not usable`)
}

export function postgresBin() {
  const base = '/usr/lib/postgresql'
  if (!existsSync(base)) return null
  const versions = execFileSync('ls', [base]).toString().split('\n').filter((v) => /^\d+$/.test(v))
  versions.sort((a, b) => Number(a) - Number(b))
  for (const v of versions.reverse()) {
    const bin = path.join(base, v, 'bin')
    if (existsSync(path.join(bin, 'initdb'))) return bin
  }
  return null
}

export { isRoot }
