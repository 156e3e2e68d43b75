import { mkdirSync, writeFileSync } from 'node:fs'
import path from 'node:path'
import { SMTPServer } from 'smtp-server'

/**
 * The local SMTP catcher: accepts every message on 127.0.0.1 and keeps it as an .eml file, so mail
 * the app sends can be read without reaching anyone.
 */
export async function startSmtpCatcher(opts: { port: number; directory: string }) {
  mkdirSync(opts.directory, { recursive: true })
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = []
      stream.on('data', (c: Buffer) => chunks.push(c))
      stream.on('end', () => {
        const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${session.id}.eml`
        writeFileSync(path.join(opts.directory, name), Buffer.concat(chunks))
        callback()
      })
    },
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(opts.port, '127.0.0.1', () => resolve())
  })
  return { close: () => new Promise<void>((resolve) => server.close(() => resolve())) }
}
