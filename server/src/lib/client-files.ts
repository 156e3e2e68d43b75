import { constants } from 'node:zlib'
import compression from 'compression'
import express, { Router, type Request, type Response } from 'express'
import expressStaticGzip from 'express-static-gzip'
import { NotFound } from './http-errors'

/** 365 days: `max-age=31536000`, the usual value for files that never change (ms's '1y' is 365.25 days). */
const ONE_YEAR_MS = 31_536_000 * 1000

/**
 * Compresses answers (brotli or gzip, as the browser asks) above 1 kB: the JSON API, the app's
 * page and its scripts and styles. Brotli at quality 5 rather than the middleware's 4: on the
 * client's main script it is 5 % smaller than gzip for about 50 ms of one core (quality 11 would
 * save 9 % more for a full second per request). PDFs and images are already compressed and are
 * left alone by the default filter (their types are not compressible); a server-sent event stream
 * would be held back by the compressor until a buffer filled, so it is never compressed.
 */
export function compressAnswers() {
  return compression({
    brotli: { params: { [constants.BROTLI_PARAM_QUALITY]: 5 } },
    filter: (req: Request, res: Response) => !String(res.getHeader('Content-Type') ?? '').startsWith('text/event-stream') && compression.filter(req, res),
  })
}

/**
 * Serves the built client. Its scripts and styles come with brotli (quality 11) and gzip copies
 * written at build time (client/vite.config.ts): the browser gets the one it accepts, and the
 * middleware above compresses only what has no copy. Vite names every file under /assets by a hash
 * of its contents, so a browser may keep them for a year without asking again (a new build has new
 * names); a missing one
 * is a 404, never the app's page (a script tag must not get HTML). The app's page itself
 * (index.html, also the answer to every client-side route) is `no-cache`: the browser checks it on
 * every load, so a new build reaches every tablet at its next load.
 */
export function clientFiles(dist: string) {
  const router = Router()
  const noCache = (res: Response) => res.setHeader('Cache-Control', 'no-cache')
  router.use(
    '/assets',
    expressStaticGzip(`${dist}/assets`, {
      enableBrotli: true,
      orderPreference: ['br', 'gzip'],
      index: false,
      serveStatic: { index: false, immutable: true, maxAge: ONE_YEAR_MS, redirect: false },
    }),
  )
  router.use('/assets', () => {
    throw new NotFound('No such file in this build of the app')
  })
  // Other files at the top of the build (icons and the like) have no hash in their names.
  router.use(express.static(dist, { index: false, maxAge: '1h', setHeaders: (res, file) => {
    // The service worker and what it is built from name no hash: checked on every load, so a new
    // build's worker (and with it the new app) reaches every tablet.
    if (/(index\.html|sw\.js|registerSW\.js|manifest\.webmanifest)$/.test(file)) noCache(res)
  } }))
  // Client-side routes: every other GET gets the app's page; React Router takes it from there.
  router.get(/.*/, (_req, res) => {
    noCache(res)
    res.sendFile('index.html', { root: dist, cacheControl: false })
  })
  return router
}
