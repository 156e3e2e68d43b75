import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core'
import { afterAll, afterEach, beforeAll, beforeEach } from 'vitest'

/** Debian's Chromium, headless, with the flags this machine's closed network needs (and any `extraArgs`). */
export function launchChromium(extraArgs: string[] = []): Promise<Browser> {
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', ...extraArgs],
  })
}

export async function signIn(page: Page, baseUrl: string, email: string, password: string) {
  await page.goto(`${baseUrl}/sign-in`)
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in', exact: true }).click()
}

/**
 * Registers the hooks most browser tests need: Chromium launched once per file, and a fresh
 * context and page (no cookies carried over) for every test. Read `.page` inside a test or hook.
 */
export function browserPerTest(viewport: { width: number; height: number }) {
  let browser: Browser
  let context: BrowserContext
  const state = { page: undefined as unknown as Page }
  beforeAll(async () => {
    browser = await launchChromium()
  })
  afterAll(() => browser.close())
  beforeEach(async () => {
    context = await browser.newContext({ viewport })
    state.page = await context.newPage()
  })
  afterEach(() => context.close())
  return state
}
