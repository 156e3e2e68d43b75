import { createServer, type IncomingMessage, type ServerResponse } from 'node:http'
import { z } from 'zod'

/**
 * The local carrier stand-in: quotes, sells labels and hands out invented tracking numbers, on
 * 127.0.0.1. Its services, prices and number format are made up for Kitwright's tests and demo; they
 * are no real carrier's.
 */
const AddressSchema = z.object({
  name: z.string().min(1),
  line1: z.string().min(1),
  line2: z.string().nullable(),
  city: z.string().min(1),
  region: z.string().nullable(),
  postalCode: z.string().min(1),
  country: z.string().length(2),
})
const ParcelSchema = z.object({
  weightGrams: z.number().int().positive().max(70_000, 'A parcel may weigh at most 70 kg'),
  lengthMm: z.number().positive(),
  widthMm: z.number().positive(),
  heightMm: z.number().positive(),
})
const RequestSchema = z.object({ from: AddressSchema, to: AddressSchema, parcels: z.array(ParcelSchema).min(1), reference: z.string() })
const LabelRequestSchema = RequestSchema.extend({ service: z.string() })

/** The stand-in's services: a base price per parcel and a price per started kilogram of billable weight. */
const SERVICES = [
  { service: 'ground', name: 'Ground', days: 5, baseCents: 895, perKgCents: 95 },
  { service: 'express', name: 'Express', days: 2, baseCents: 1995, perKgCents: 210 },
] as const

function price(service: (typeof SERVICES)[number], parcels: z.infer<typeof ParcelSchema>[], international: boolean) {
  const cents = parcels.reduce((sum, p) => sum + service.baseCents + Math.ceil(p.weightGrams / 1000) * service.perKgCents, 0)
  return international ? cents * 2 : cents
}

async function readJson(req: IncomingMessage): Promise<unknown> {
  const chunks: Buffer[] = []
  for await (const chunk of req) chunks.push(chunk as Buffer)
  try {
    return JSON.parse(Buffer.concat(chunks).toString('utf8'))
  } catch {
    return null
  }
}

function send(res: ServerResponse, status: number, body: unknown) {
  res.writeHead(status, { 'content-type': 'application/json' })
  res.end(JSON.stringify(body))
}

export async function startCarrierFake(opts: { port: number }) {
  let sequence = 0
  let boundPort = opts.port
  const labels = new Map<string, { service: string; reference: string; parcels: number }>()
  const server = createServer((req, res) => {
    void (async () => {
      const url = new URL(req.url ?? '/', 'http://127.0.0.1')
      if (req.method === 'GET' && url.pathname.startsWith('/v1/labels/')) {
        const label = labels.get(decodeURIComponent(url.pathname.slice('/v1/labels/'.length)))
        return label ? send(res, 200, label) : send(res, 404, { error: { message: 'No such tracking number' } })
      }
      if (req.method !== 'POST' || (url.pathname !== '/v1/quotes' && url.pathname !== '/v1/labels')) return send(res, 404, { error: { message: 'No such carrier endpoint' } })
      const parsed = (url.pathname === '/v1/labels' ? LabelRequestSchema : RequestSchema).safeParse(await readJson(req))
      if (!parsed.success) {
        const issue = parsed.error.issues[0]
        return send(res, 400, { error: { message: `${issue?.path.join('.') || 'request'}: ${issue?.message ?? 'invalid'}` } })
      }
      const request = parsed.data
      const international = request.from.country !== request.to.country
      if (url.pathname === '/v1/quotes') {
        return send(res, 200, { quotes: SERVICES.map((s) => ({ service: s.service, name: s.name, days: s.days + (international ? 3 : 0), chargeCents: price(s, request.parcels, international) })) })
      }
      const service = SERVICES.find((s) => s.service === (request as z.infer<typeof LabelRequestSchema>).service)
      if (!service) return send(res, 400, { error: { message: `No service "${(request as z.infer<typeof LabelRequestSchema>).service}"; choose ${SERVICES.map((s) => s.service).join(' or ')}` } })
      sequence += 1
      // Invented format: KWT, the date, the port (so two stand-ins never collide) and a running number.
      const day = new Date().toISOString().slice(2, 10).replace(/-/g, '')
      const trackingNumber = `KWT${day}${String(boundPort).padStart(5, '0')}${String(sequence).padStart(5, '0')}`
      labels.set(trackingNumber, { service: service.service, reference: request.reference, parcels: request.parcels.length })
      return send(res, 201, {
        trackingNumber,
        service: service.service,
        chargeCents: price(service, request.parcels, international),
        routingCode: `${request.to.country}-${request.to.postalCode.replace(/\s+/g, '').slice(0, 3).toUpperCase()}`,
      })
    })().catch((err: unknown) => send(res, 500, { error: { message: err instanceof Error ? err.message : 'failed' } }))
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(opts.port, '127.0.0.1', () => resolve())
  })
  const address = server.address()
  boundPort = typeof address === 'object' && address ? address.port : opts.port
  return { port: boundPort, url: `http://127.0.0.1:${boundPort}`, close: () => new Promise<void>((resolve) => server.close(() => resolve())) }
}
