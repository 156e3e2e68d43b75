// A light client (issue 13, item 6), as a browser sees it: cold loads that log no console error and
// no router warning (no "No `HydrateFallback` element"), no failed request for who is signed in, a
// title of its own on every page, and a sign-in page that does not fetch the signed-in pages or the
// chart library. The bytes and times are measured by `npm run bench:client`, not asserted here.
import type { ConsoleMessage, Page, Response } from 'playwright-core'
import { describe, expect, inject, it } from 'vitest'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { browserPerTest } from '../support/browser'

const baseUrl = inject('baseUrl')
const browser = browserPerTest({ width: 1280, height: 800 })

function demo(role: string) {
  const u = DEMO_USERS.find((d) => d.role === role)
  if (!u) throw new Error(`no demo ${role}`)
  return u
}

/** Every console error and warning, every page error and every API answer of 400 or more. */
function watch(page: Page) {
  const problems: string[] = []
  const scripts: Response[] = []
  page.on('console', (m: ConsoleMessage) => {
    if (m.type() === 'error' || m.type() === 'warning') problems.push(`${m.type()}: ${m.text()} (${m.location().url})`)
  })
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`))
  page.on('response', (r) => {
    if (r.request().resourceType() === 'script') scripts.push(r)
    if (r.url().includes('/api/') && r.status() >= 400) problems.push(`${r.status()} from ${r.request().method()} ${new URL(r.url()).pathname}`)
  })
  return { problems, scripts }
}

async function signInWith(page: Page, email: string, password: string) {
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in', exact: true }).click()
}

describe('first loads in Chromium', () => {
  it('walks from a cold sign-in through the office pages with no console error or warning, each page with its own title', async () => {
    const { page } = browser
    const { problems, scripts } = watch(page)
    await page.goto(`${baseUrl}/`)
    await page.getByRole('button', { name: 'Sign in', exact: true }).waitFor()
    expect(new URL(page.url()).pathname).toBe('/sign-in')
    await expect.poll(() => page.title()).toBe('Sign in · Kitwright')

    // Before signing in: the sign-in page's own code, not the pages behind it nor the chart library.
    await page.waitForLoadState('networkidle')
    const signInScripts = scripts.map((r) => new URL(r.url()).pathname)
    expect(signInScripts.length).toBeGreaterThan(0)
    for (const name of ['home-', 'app-shell-', 'orders-', 'pack-']) expect(signInScripts.filter((s) => s.startsWith(`/assets/${name}`)), name).toEqual([])
    for (const r of scripts) expect((await r.text()).includes('recharts-surface'), r.url()).toBe(false)

    const planner = demo('planner')
    await signInWith(page, planner.email, planner.password)
    await page.getByRole('heading', { name: /Good day/ }).waitFor()
    await expect.poll(() => page.title()).toBe('Home · Kitwright')
    // The charts arrive after the page is usable, drawn by their own code.
    await expect.poll(() => page.locator('.recharts-surface').count(), { timeout: 20_000 }).toBeGreaterThanOrEqual(3)

    const nav = page.getByRole('navigation', { name: 'Main' })
    for (const [link, title] of [
      ['Orders', 'Orders · Kitwright'],
      ['Cut runs', 'Cut runs · Kitwright'],
      ['Pack bench', 'Pack bench · Kitwright'],
    ] as const) {
      await nav.getByRole('link', { name: link, exact: true }).click()
      await page.getByRole('heading', { level: 1, name: link }).waitFor()
      await expect.poll(() => page.title()).toBe(title)
    }
    // A page opened cold by its address while signed in, and a page that does not exist.
    await page.goto(`${baseUrl}/catalog/parts`)
    await page.getByRole('heading', { level: 1, name: 'Parts' }).waitFor()
    await expect.poll(() => page.title()).toBe('Parts · Kitwright')
    await page.goto(`${baseUrl}/no-such-page`)
    await page.getByRole('heading', { name: 'Page not found' }).waitFor()
    await expect.poll(() => page.title()).toBe('Page not found · Kitwright')
    expect(problems).toEqual([])
  })

  it('opens a bench by its address cold: sign-in, then the bench with its scan field, with no console error or warning', async () => {
    const { page } = browser
    const { problems } = watch(page)
    await page.goto(`${baseUrl}/bench/build`)
    await page.getByRole('button', { name: 'Sign in', exact: true }).waitFor()
    expect(new URL(page.url()).pathname).toBe('/sign-in')
    const assembler = demo('assembler')
    await signInWith(page, assembler.email, assembler.password)
    await page.getByRole('heading', { level: 1, name: 'Build bench' }).waitFor()
    await page.getByPlaceholder('Scan or type a code, then Enter').waitFor()
    expect(new URL(page.url()).pathname).toBe('/bench/build')
    await expect.poll(() => page.title()).toBe('Build bench · Kitwright')
    // Reloaded cold while signed in: straight to the bench.
    await page.reload()
    await page.getByPlaceholder('Scan or type a code, then Enter').waitFor()
    await expect.poll(() => page.title()).toBe('Build bench · Kitwright')
    expect(problems).toEqual([])
  })
})
