import { spawn, spawnSync } from 'node:child_process'
import { chmodSync, copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync, symlinkSync, utimesSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { freePort } from './private-services'

// A newcomer's clone inside a folder only its owner may enter (mode 0700, as a root user's home is):
// the start-up script must still create, start and migrate its private PostgreSQL cluster, without
// loosening that folder. The clone is the working tree's tracked files, with node_modules linked in.

const root = path.resolve(import.meta.dirname, '../..')
const privateFolder = mkdtempSync(path.join(tmpdir(), 'kitwright-private-'))
const clone = path.join(privateFolder, 'kitwright-clone')
let clusterFolder: string | null = null

function copyTrackedFiles() {
  const files = spawnSync('git', ['ls-files', '-z'], { cwd: root, encoding: 'utf8' }).stdout.split('\0').filter(Boolean)
  for (const file of files) {
    if (!existsSync(path.join(root, file))) continue // deleted in the working tree, not yet committed
    mkdirSync(path.dirname(path.join(clone, file)), { recursive: true })
    copyFileSync(path.join(root, file), path.join(clone, file))
  }
  symlinkSync(path.join(root, 'node_modules'), path.join(clone, 'node_modules'))
  // The lock file must not look newer than the installed modules, or the script would run `npm ci`.
  const installed = statSync(path.join(root, 'node_modules/.package-lock.json')).mtime
  utimesSync(path.join(clone, 'package-lock.json'), installed, new Date(installed.getTime() - 60_000))
}

function runStart(args: string[], env: Record<string, string>): Promise<{ code: number | null; output: string }> {
  return new Promise((resolve) => {
    const childEnv: NodeJS.ProcessEnv = { ...process.env, ...env }
    delete childEnv.DATABASE_URL // the clone's own cluster, not a database of this run
    const child = spawn(process.execPath, ['scripts/start.mjs', ...args], { cwd: clone, env: childEnv })
    let output = ''
    child.stdout.on('data', (d) => (output += d))
    child.stderr.on('data', (d) => (output += d))
    child.on('exit', (code) => resolve({ code, output }))
  })
}

afterAll(() => {
  if (clusterFolder) rmSync(clusterFolder, { recursive: true, force: true })
  rmSync(privateFolder, { recursive: true, force: true })
})

describe('a clone in a folder only its owner may enter', () => {
  it('creates, starts and migrates its database cluster, and leaves the folder private', async () => {
    chmodSync(privateFolder, 0o700)
    copyTrackedFiles()
    const port = await freePort()
    const { code, output } = await runStart(['--only-migrate'], { KITWRIGHT_PG_PORT: String(port) })

    expect(output).not.toMatch(/Permission denied/)
    expect(code, output).toBe(0)
    expect(output).toMatch(/migrat/i)
    expect(statSync(privateFolder).mode & 0o777).toBe(0o700)

    const pointer = path.join(clone, '.data/pg-cluster-location')
    const runningAsRoot = process.getuid?.() === 0
    if (runningAsRoot) {
      // The postgres OS user cannot enter the clone, so the cluster lives outside it, named after it.
      clusterFolder = readFileSync(pointer, 'utf8').trim()
      expect(clusterFolder.startsWith(clone)).toBe(false)
      expect(path.basename(clusterFolder)).toMatch(/^kitwright-clone-[0-9a-f]{10}$/)
      expect(existsSync(path.join(clusterFolder, 'pg/PG_VERSION'))).toBe(true)
    } else {
      // An ordinary user runs the server as itself, inside the clone.
      expect(existsSync(pointer)).toBe(false)
      expect(existsSync(path.join(clone, '.data/pg/PG_VERSION'))).toBe(true)
    }

    // A second start finds the same cluster again.
    const again = await runStart(['--only-migrate'], { KITWRIGHT_PG_PORT: String(port) })
    expect(again.code, again.output).toBe(0)
    expect(again.output).not.toMatch(/creating a private PostgreSQL cluster/)
  })
})
