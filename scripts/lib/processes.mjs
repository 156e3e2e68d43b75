import { spawn } from 'node:child_process'
import path from 'node:path'
import { step } from './log.mjs'
import { root } from './system.mjs'

const children = new Set()
const cleanups = []

export const tsxBin = path.join(root, 'node_modules/.bin/tsx')

/**
 * Starts a child process; resolves once a line of its output matches `readyWhen` (or at once when
 * none is given). Its output is passed through with a prefix.
 */
export function startChild(name, cmd, args, { env = {}, readyWhen, quiet = false } = {}) {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { cwd: root, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] })
    children.add(child)
    let ready = !readyWhen
    const onLine = (line, stream) => {
      if (!ready && readyWhen.test(line)) {
        ready = true
        resolve(child)
      }
      if (!quiet || stream === 'err') process[stream === 'err' ? 'stderr' : 'stdout'].write(`[${name}] ${line}\n`)
    }
    for (const [stream, src] of [['out', child.stdout], ['err', child.stderr]]) {
      let buf = ''
      src.on('data', (d) => {
        buf += d
        let i
        while ((i = buf.indexOf('\n')) >= 0) {
          onLine(buf.slice(0, i), stream)
          buf = buf.slice(i + 1)
        }
      })
    }
    child.on('exit', (code, signal) => {
      children.delete(child)
      if (!ready) reject(new Error(`${name} exited before it was ready (${code ?? signal})`))
    })
    if (ready) resolve(child)
  })
}

/** Something to undo on exit (stop PostgreSQL, say), run after the children are gone. */
export function onCleanup(fn) {
  cleanups.push(fn)
}

let stopping = false
export async function stopAll(code = 0) {
  if (stopping) return
  stopping = true
  for (const child of children) child.kill('SIGTERM')
  await Promise.all(
    [...children].map(
      (child) =>
        new Promise((resolve) => {
          const t = setTimeout(() => {
            child.kill('SIGKILL')
            resolve()
          }, 8000)
          child.once('exit', () => {
            clearTimeout(t)
            resolve()
          })
        }),
    ),
  )
  for (const fn of cleanups.reverse()) await fn()
  process.exit(code)
}

export function stopOnSignals() {
  for (const sig of ['SIGINT', 'SIGTERM', 'SIGHUP']) {
    process.on(sig, () => {
      step(`${sig}: stopping everything that was started`)
      void stopAll(0)
    })
  }
}
