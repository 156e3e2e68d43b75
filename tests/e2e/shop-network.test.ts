// Kitwright on the shop's network (issue 13): a tablet reaches the app by a host name that is not
// loopback. The server listens on this machine's network address only; Chromium maps the shop
// computer's name "shop-pc.test" to that address (--host-resolver-rules), as the shop's router or a
// hosts entry would. On a tablet viewport: the owner's QR code opens the bench PIN sign-in, the
// assembler scans a bin and uploads a photo through the photo store's public address, with no
// request blocked on the way.
import { spawn, type ChildProcess } from 'node:child_process'
import { createServer } from 'node:net'
import os from 'node:os'
import path from 'node:path'
import { BarcodeFormat, BinaryBitmap, DecodeHintType, HybridBinarizer, MultiFormatReader, RGBLuminanceSource } from '@zxing/library'
import { and, eq } from 'drizzle-orm'
import type { Browser, Page } from 'playwright-core'
import { PNG } from 'pngjs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createDb } from '../../server/src/db/client'
import { buildSteps, kitRevisions, kits, unitPhotos } from '../../server/src/db/schema/index'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { startS3Fake } from '../../storage-fake/s3'
import { launchChromium, signIn } from '../support/browser'
import { insertBin, insertBuildWorkOrder } from '../support/build-factories'
import { testDatabaseUrl } from '../support/env'

const root = path.resolve(import.meta.dirname, '../..')
const runDir = process.env.TEST_RUN_DIR ?? path.join(root, '.data/test/manual')
const HOST_NAME = 'shop-pc.test'
const owner = DEMO_USERS.find((u) => u.role === 'admin')!
const assembler = DEMO_USERS.find((u) => u.role === 'assembler')!

/**
 * This machine's first IPv4 address on a network (os.networkInterfaces, not internal). A machine with
 * none falls back to 127.0.0.2: still not the 127.0.0.1 everything else here uses, but loopback.
 */
function networkAddress(): { address: string; fallback: boolean } {
  const found = Object.values(os.networkInterfaces())
    .flatMap((list) => list ?? [])
    .find((a) => a.family === 'IPv4' && !a.internal)
  return found ? { address: found.address, fallback: false } : { address: '127.0.0.2', fallback: true }
}

function freePort(host: string): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer()
    srv.once('error', reject)
    srv.listen(0, host, () => {
      const addr = srv.address()
      srv.close(() => (typeof addr === 'object' && addr ? resolve(addr.port) : reject(new Error('no free port'))))
    })
  })
}

/** Reads a QR code (ISO/IEC 18004) from a PNG with ZXing, a decoder independent of the `qrcode` package that drew it. */
function decodeQr(png: Buffer): string {
  const img = PNG.sync.read(png)
  const luminance = new Uint8ClampedArray(img.width * img.height)
  for (let i = 0; i < luminance.length; i++) luminance[i] = (img.data[i * 4]! * 299 + img.data[i * 4 + 1]! * 587 + img.data[i * 4 + 2]! * 114) / 1000
  const reader = new MultiFormatReader()
  reader.setHints(new Map<DecodeHintType, unknown>([[DecodeHintType.POSSIBLE_FORMATS, [BarcodeFormat.QR_CODE]]]))
  return reader.decode(new BinaryBitmap(new HybridBinarizer(new RGBLuminanceSource(luminance, img.width, img.height)))).getText()
}

/** A small blue PNG, as a tablet camera might hand over. */
function photoPng(): Buffer {
  const png = new PNG({ width: 40, height: 30 })
  for (let i = 0; i < png.data.length; i += 4) png.data.set([30, 90, 170, 255], i)
  return PNG.sync.write(png)
}

/** Everything the page's console said was an error or a warning, and every request that failed (blocked, refused, unreachable). */
function watchForTrouble(page: Page) {
  const trouble: string[] = []
  page.on('console', (msg) => {
    if (msg.type() !== 'error' && msg.type() !== 'warning') return
    // The app asks who is signed in on a cold load; the 401 before sign-in is expected (issue 13, item 6).
    if (/status of 401/.test(msg.text()) && msg.location().url.endsWith('/api/auth/me')) return
    trouble.push(`console: ${msg.text()} (${msg.location().url})`)
  })
  page.on('pageerror', (err) => trouble.push(`page error: ${err.message}`))
  page.on('requestfailed', (req) => {
    // Requests the page itself cancelled when it moved on (leaving the home page) are not blocked ones.
    if (req.failure()?.errorText === 'net::ERR_ABORTED') return
    trouble.push(`request failed: ${req.method()} ${req.url()} ${req.failure()?.errorText ?? ''}`)
  })
  return trouble
}

/** A unit of the demo 12-site kit, revision A, cut and waiting in a bin at the build bench. */
async function unitInABin() {
  const [rev] = await conn.db
    .select({ id: kitRevisions.id, kitId: kits.id })
    .from(kitRevisions)
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .where(and(eq(kits.sku, 'MW-TOTE-12'), eq(kitRevisions.code, 'A')))
  const wo = await insertBuildWorkOrder(conn.db, rev!.id, rev!.kitId, 'cut')
  const bin = await insertBin(conn.db, wo.id)
  const steps = await conn.db.select().from(buildSteps).where(eq(buildSteps.revisionId, rev!.id))
  return { wo, bin, steps: steps.sort((a, b) => a.position - b.position) }
}

const lan = networkAddress()
let appPort: number
let s3Port: number
let api: ChildProcess
let s3: { close(): Promise<unknown> }
let browser: Browser
let conn: ReturnType<typeof createDb>
const bucket = 'kitwright-shop-network'

beforeAll(async () => {
  if (lan.fallback) console.log(`[shop-network] this machine has no network IPv4 address besides loopback; using ${lan.address} instead`)
  appPort = await freePort(lan.address)
  s3Port = await freePort('0.0.0.0')
  const appOrigin = `http://${HOST_NAME}:${appPort}`
  // The photo store as `npm start -- --lan` runs it: on every address, allowing the app's origin only.
  s3 = await startS3Fake({ port: s3Port, address: '0.0.0.0', directory: path.join(runDir, 'shop-network-s3'), bucket, allowedOrigins: [appOrigin] })
  api = spawn(path.join(root, 'node_modules/.bin/tsx'), ['server/src/index.ts'], {
    cwd: root,
    env: {
      ...process.env,
      DATABASE_URL: testDatabaseUrl('e2e'),
      HOST: lan.address,
      PORT: String(appPort),
      PUBLIC_URL: appOrigin,
      SESSION_SECRET: 'kitwright-e2e-secret-0123456789abcdef',
      CLIENT_DIST: path.join(runDir, 'client-dist'),
      // The server talks to the store on loopback; browsers get URLs for its network address.
      S3_ENDPOINT: `http://127.0.0.1:${s3Port}`,
      S3_PUBLIC_URL: `http://${lan.address}:${s3Port}`,
      S3_BUCKET: bucket,
      S3_ACCESS_KEY_ID: 'S3RVER',
      S3_SECRET_ACCESS_KEY: 'S3RVER',
      RUN_WORKERS: 'false',
      LOG_LEVEL: 'warn',
      // As `npm start` runs it: production (session cookies Secure only where the request is HTTPS).
      NODE_ENV: 'production',
      STORE_WEBHOOK_SECRET: 'kitwright-shop-network-store-secret-0123456789',
    },
    stdio: ['ignore', 'pipe', 'inherit'],
  })
  await new Promise<void>((resolve, reject) => {
    api.stdout!.on('data', (d: Buffer) => {
      if (d.toString().includes('listening on')) resolve()
    })
    api.once('exit', (code) => reject(new Error(`API exited early (${code})`)))
  })
  browser = await launchChromium([`--host-resolver-rules=MAP ${HOST_NAME} ${lan.address}`])
  conn = createDb(testDatabaseUrl('e2e'))
})

afterAll(async () => {
  await browser?.close()
  await conn?.pool.end()
  if (api && api.exitCode === null) {
    api.kill('SIGTERM')
    await new Promise((r) => api.once('exit', r))
  }
  await s3?.close()
})

describe('a tablet on the shop network, in Chromium', () => {
  it('listens on the network address only, not on loopback', async () => {
    expect(lan.address).not.toBe('127.0.0.1')
    const onLoopback = await fetch(`http://127.0.0.1:${appPort}/api/health`).then(
      () => 'answered',
      (err: Error) => (err.cause as NodeJS.ErrnoException | undefined)?.code ?? err.message,
    )
    expect(onLoopback).toBe('ECONNREFUSED')
  })

  it('opens the QR code of "Connect a tablet", signs in with the bench PIN, scans a bin and uploads a photo to the public photo store', async () => {
    const base = `http://${HOST_NAME}:${appPort}`
    // The owner, at the shop computer, opens "Connect a tablet".
    const office = await browser.newContext({ viewport: { width: 1280, height: 900 } })
    const ownerPage = await office.newPage()
    const ownerTrouble = watchForTrouble(ownerPage)
    await signIn(ownerPage, base, owner.email, owner.password)
    await ownerPage.getByRole('link', { name: 'Tablets' }).click()
    await ownerPage.getByRole('heading', { name: 'Connect a tablet' }).waitFor()
    expect(await ownerPage.getByTestId('tablet-address').textContent()).toBe(`${base}/sign-in?with=pin`)
    // Nothing stands in the way: listening on the network, public address and photo store reachable.
    expect(await ownerPage.getByRole('alert', { name: 'Tablets cannot connect yet' }).count()).toBe(0)
    const qr = ownerPage.getByRole('img', { name: `QR code of ${base}/sign-in?with=pin` })
    await ownerPage.waitForFunction(() => Array.from(document.images).every((img) => img.complete && img.naturalWidth > 0))
    const fromQr = decodeQr(await qr.screenshot())
    expect(fromQr).toBe(`${base}/sign-in?with=pin`)
    if (process.env.SHOP_NETWORK_SHOTS) await ownerPage.screenshot({ path: `${process.env.SHOP_NETWORK_SHOTS}/connect-a-tablet.png`, fullPage: true })
    expect(ownerTrouble).toEqual([])
    await office.close()

    // The tablet, portrait, opens what the QR code holds.
    const { wo, bin, steps } = await unitInABin()
    const tablet = await browser.newContext({ viewport: { width: 820, height: 1180 }, hasTouch: true })
    const page = await tablet.newPage()
    const trouble = watchForTrouble(page)
    const puts: string[] = []
    page.on('request', (req) => {
      if (req.method() === 'PUT') puts.push(req.url())
    })
    const first = await page.goto(fromQr)
    // Plain HTTP on the shop network: nothing tells the tablet to switch to https://.
    expect(first!.headers()['strict-transport-security']).toBeUndefined()
    expect(first!.headers()['content-security-policy']).not.toContain('upgrade-insecure-requests')
    expect(await page.getByRole('tab', { name: 'Bench PIN' }).getAttribute('aria-selected')).toBe('true')
    await page.getByRole('group', { name: 'Your name' }).getByRole('button', { name: assembler.name, exact: true }).click()
    await page.getByLabel('Bench PIN').fill(assembler.pin!)
    await page.getByRole('button', { name: 'Sign in at the bench' }).click()
    await page.getByRole('heading', { name: 'Build bench' }).waitFor()
    expect(new URL(page.url()).host).toBe(`${HOST_NAME}:${appPort}`)

    // The wedge scanner types the bin's code and Enter into the focused scan field.
    await page.waitForFunction(() => document.activeElement?.getAttribute('placeholder') === 'Scan or type a code, then Enter')
    await page.keyboard.type(bin.code)
    await page.keyboard.press('Enter')
    await page.getByRole('heading', { name: `Unit ${wo.serial}` }).waitFor()

    for (const step of steps) {
      const card = page.getByRole('listitem', { name: `Step ${step.position}`, exact: true })
      if (step.measurementRequired) {
        const middle = (Number(step.measurementMin) + Number(step.measurementMax)) / 2
        await card.getByLabel(`Measurement for step ${step.position} in ${step.measurementUnit}`).fill(String(middle))
      }
      if (step.photoRequired) {
        await card.getByLabel(`Photo for step ${step.position}`).setInputFiles({ name: 'unit.png', mimeType: 'image/png', buffer: photoPng() })
        await card.getByRole('img').waitFor()
        const src = await card.getByRole('img').getAttribute('src')
        expect(new URL(src!).origin).toBe(`http://${lan.address}:${s3Port}`)
        expect(await card.getByRole('img').evaluate((img: HTMLImageElement) => img.naturalWidth)).toBe(40)
        break
      }
      await card.getByRole('button', { name: `Tick step ${step.position}` }).click()
      await card.getByRole('button', { name: `Undo step ${step.position}` }).waitFor()
    }
    // The photo went from the tablet straight to the store's public address, and the server saw it there.
    expect(puts.map((u) => new URL(u).origin)).toEqual([`http://${lan.address}:${s3Port}`])
    const photos = await conn.db.select().from(unitPhotos).where(eq(unitPhotos.workOrderId, wo.id))
    expect(photos.map((p) => [p.contentType, p.uploadedAt !== null])).toEqual([['image/png', true]])
    if (process.env.SHOP_NETWORK_SHOTS) await page.screenshot({ path: `${process.env.SHOP_NETWORK_SHOTS}/tablet-build-bench.png`, fullPage: true })
    expect(trouble).toEqual([])
    await tablet.close()
  })
})
