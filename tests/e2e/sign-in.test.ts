import type { Browser, BrowserContext, Page } from 'playwright-core'
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { launchChromium, signIn } from '../support/browser'

const baseUrl = inject('baseUrl')
let browser: Browser
let context: BrowserContext
let page: Page

function demo(role: string) {
  const u = DEMO_USERS.find((d) => d.role === role)
  if (!u) throw new Error(`no demo ${role}`)
  return u
}

beforeAll(async () => {
  browser = await launchChromium()
})
afterAll(() => browser.close())
beforeEach(async () => {
  context = await browser.newContext({ viewport: { width: 1280, height: 800 } })
  page = await context.newPage()
})
afterEach(() => context.close())

describe('signing in, in Chromium', () => {
  it('sends a visitor to the sign-in page, then a planner to the home page', async () => {
    await page.goto(`${baseUrl}/`)
    await page.waitForURL(/\/sign-in/)
    const planner = demo('planner')
    await page.getByLabel('E-mail').fill(planner.email)
    await page.getByLabel('Password').fill(planner.password)
    await page.getByRole('button', { name: 'Sign in', exact: true }).click()
    await page.getByRole('heading', { name: /Good day, Tomas/ }).waitFor()
    expect(new URL(page.url()).pathname).toBe('/')
    const nav = page.getByRole('navigation', { name: 'Main' })
    const links = await nav.getByRole('link').allTextContents()
    expect(links).toEqual(expect.arrayContaining(['Home', 'Kits', 'Cut bench', 'Build bench', 'Pack bench']))
    expect(links).not.toContain('Users') // the owner's page only
    // The bundled font, not a CDN: the page asked for no other host.
    expect(await page.evaluate(() => document.fonts.check('16px "Roboto Condensed"'))).toBe(true)
  })

  it('lands a packer on the pack bench, with only that bench (and the returns it receives) in the menu', async () => {
    const packer = demo('packer')
    await signIn(page, baseUrl, packer.email, packer.password)
    await page.getByRole('heading', { name: 'Pack bench' }).waitFor()
    expect(new URL(page.url()).pathname).toBe('/bench/pack')
    expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link').allTextContents()).toEqual(['Pack bench', 'Returns', 'Scan'])
    // A packer who types the users page's address is sent back to their bench.
    await page.goto(`${baseUrl}/admin/users`)
    await page.getByRole('heading', { name: 'Pack bench' }).waitFor()
  })

  it('signs a cutter in with a bench PIN and lands on the cut bench', async () => {
    const cutter = demo('cutter')
    await page.goto(`${baseUrl}/sign-in`)
    await page.getByRole('tab', { name: 'Bench PIN' }).click()
    // No e-mail at the bench: the cutter picks their name, then types the PIN.
    await page.getByRole('group', { name: 'Your name' }).getByRole('button', { name: cutter.name, exact: true }).click()
    await page.getByLabel('Bench PIN').fill(cutter.pin!)
    await page.getByRole('button', { name: 'Sign in at the bench' }).click()
    await page.getByRole('heading', { name: 'Cut bench' }).waitFor()
    expect(new URL(page.url()).pathname).toBe('/bench/cut')
  })

  it("shows the server's message on a wrong password and stays on the sign-in page", async () => {
    await signIn(page, baseUrl, demo('planner').email, 'not-the-password')
    await page.getByText('That e-mail and password do not match').waitFor()
    expect(new URL(page.url()).pathname).toBe('/sign-in')
  })

  it('lets the owner add a user on the users page, who can then sign in', async () => {
    const owner = demo('admin')
    await signIn(page, baseUrl, owner.email, owner.password)
    await page.getByRole('link', { name: 'Users' }).click()
    await page.getByRole('heading', { name: 'Users' }).waitFor()
    const form = page.getByRole('form', { name: 'New user' })
    await form.getByLabel('Name').fill('Pat Newhand')
    await form.getByLabel('E-mail').fill('pat@mistwell.example')
    await form.getByLabel('Role').selectOption('packer')
    await form.getByLabel('Password').fill('pat-first-day')
    await form.getByRole('button', { name: 'Add user' }).click()
    await page.getByRole('cell', { name: 'pat@mistwell.example' }).waitFor()

    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.waitForURL(/\/sign-in/)
    await signIn(page, baseUrl, 'pat@mistwell.example', 'pat-first-day')
    await page.getByRole('heading', { name: 'Pack bench' }).waitFor()
  })

  it('shows a 404 page for an unknown address', async () => {
    await signIn(page, baseUrl, demo('planner').email, demo('planner').password)
    await page.getByRole('heading', { name: /Good day/ }).waitFor()
    await page.goto(`${baseUrl}/no/such/page`)
    await page.getByRole('heading', { name: 'Page not found' }).waitFor()
  })
})
