import { randomUUID } from 'node:crypto'
import { pino } from 'pino'
import { pinoHttp } from 'pino-http'

export function createLogger(level: string) {
  return pino({ level, redact: ['req.headers.cookie', 'req.headers.authorization', 'res.headers["set-cookie"]'] })
}
export type Logger = ReturnType<typeof createLogger>

export function requestLogger(logger: Logger) {
  return pinoHttp({
    logger,
    genReqId: (req, res) => {
      const given = req.headers['x-request-id']
      const reqId = typeof given === 'string' && /^[\w-]{1,64}$/.test(given) ? given : randomUUID()
      res.setHeader('x-request-id', reqId)
      return reqId
    },
  })
}
