import type { Browser, BrowserContext, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO, startApp, waitForMail, type RunningApp } from '../support/app'
import { artifact, launchBrowser, openReady } from '../support/browser'

// A leader's campaign on a tablet, by touch: a group with a group site, a campaign on it, one member invited
// by e-mail (who signs up from the link) and one who joins with the code; both log an evening from their
// campaign card; the leader watches the grid fill in, reads the comparison and comments.

let app: RunningApp
let browser: Browser
const contexts: BrowserContext[] = []
const TABLET = { viewport: { width: 1180, height: 820 }, hasTouch: true, isMobile: false }
const GROUP = 'Harrier Hill astronomy club'
const CAMPAIGN = 'December crescent'
const INVITEE = 'pupil.one@example.test'

async function tabletPage(): Promise<Page> {
  const context = await browser.newContext(TABLET)
  contexts.push(context)
  return context.newPage()
}

async function signIn(page: Page, who: { email: string, password: string }) {
  await openReady(page, `${app.url}/sign-in`)
  await page.getByLabel('E-mail').fill(who.email)
  await page.getByLabel('Password').fill(who.password)
  await page.getByRole('button', { name: 'Sign in' }).tap()
  await page.getByText('Welcome back').waitFor()
}

/** From the member's home page: the campaign's card, "Log this evening", readings, save. */
async function logFromCard(page: Page, clinometer: string, compass: string) {
  await openReady(page, app.url)
  const card = page.getByTestId('campaign-card').filter({ hasText: CAMPAIGN })
  await card.waitFor()
  await card.getByRole('link', { name: 'Log this evening' }).tap()
  await page.waitForURL(/\/observations\/new\?/)
  await page.waitForSelector('html[data-hydrated="true"]', { state: 'attached' })
  await page.getByLabel('Clinometer reading (°)').fill(clinometer)
  await page.getByLabel('Compass bearing (° magnetic)').fill(compass)
  // A campaign night still to come is saved once the member confirms the date and time.
  const plausibility = page.getByTestId('plausibility')
  if (await plausibility.count()) await plausibility.getByRole('checkbox').tap()
  await page.getByRole('button', { name: 'Save observation' }).tap()
  await page.waitForURL(/\/observations\/[0-9a-f-]{36}$/)
}

let leader: Page
let campaignUrl = ''

beforeAll(async () => {
  app = await startApp()
  browser = await launchBrowser()
  leader = await tabletPage()
  await signIn(leader, DEMO.moderator)
})
afterAll(async () => {
  for (const context of contexts) await context.close()
  await browser?.close()
  await app?.stop()
})

describe('a leader runs a campaign', () => {
  it('creates a group with a group site and a campaign on it', async () => {
    await openReady(leader, `${app.url}/groups`)
    await leader.getByLabel('Name', { exact: true }).fill(GROUP)
    await leader.getByLabel('Short description').fill('Tuesday evenings on the hill')
    await leader.getByRole('button', { name: 'Create the group' }).tap()
    await leader.getByRole('heading', { name: GROUP }).waitFor()
    await leader.waitForSelector('html[data-hydrated="true"]', { state: 'attached' })
    await leader.getByRole('button', { name: 'Add a group site' }).tap()
    await leader.getByLabel('Name', { exact: true }).fill('Harrier Hill car park')
    await leader.getByLabel('Latitude (° north, negative south)').fill('52.712')
    await leader.getByLabel('Longitude (° east, negative west)').fill('-1.811')
    await leader.getByRole('button', { name: 'Save the site' }).tap()
    await leader.getByText('Harrier Hill car park').waitFor()

    await leader.getByRole('link', { name: 'New campaign' }).tap()
    await leader.getByRole('heading', { name: /New campaign/ }).waitFor()
    await leader.waitForSelector('html[data-hydrated="true"]', { state: 'attached' })
    await leader.getByLabel('Title').fill(CAMPAIGN)
    // The proposal arrives with the evenings ticked and the clock time filled in.
    await leader.locator('input[type=checkbox][value]').first().waitFor()
    expect(await leader.locator('input[type=checkbox][value]:checked').count()).toBeGreaterThanOrEqual(8)
    expect(await leader.getByLabel('Clock time to observe at').inputValue()).toMatch(/^1[5-9]:(00|15|30|45)$/)
    await leader.screenshot({ path: artifact('campaign-new.png'), fullPage: true })
    await leader.getByRole('button', { name: 'Start the campaign' }).tap()
    await leader.getByRole('heading', { name: CAMPAIGN }).waitFor()
    campaignUrl = leader.url()
  })

  it('invites one member by e-mail and shows the join code for another', async () => {
    await leader.getByRole('link', { name: GROUP }).tap()
    await leader.getByRole('heading', { name: GROUP }).waitFor()
    await leader.waitForSelector('html[data-hydrated="true"]', { state: 'attached' })
    await leader.getByLabel(/Addresses/).fill(INVITEE)
    await leader.getByRole('button', { name: 'Send invitations' }).tap()
    await leader.getByText('1 invitation sent.').waitFor()
    await leader.getByRole('button', { name: 'Make a code' }).tap()
    await leader.getByTestId('join-code').waitFor()
  })

  it('the invited member signs up from the link and logs an evening from the campaign card', async () => {
    const mail = await waitForMail(app.dataDir, INVITEE, /invited to join/)
    const link = mail.text.match(/https?:\/\/\S+\/groups\/join\?token=[\w-]+/)![0]
    const member = await tabletPage()
    await openReady(member, link)
    await member.getByText(`You are invited to ${GROUP}`).waitFor()
    await member.getByLabel('Display name').fill('Pip')
    await member.getByLabel(/^Password/).fill('pip-long-password')
    await member.getByRole('button', { name: 'Make the account and join' }).tap()
    await member.getByText('Welcome back, Pip').waitFor()
    await logFromCard(member, '75', '230')
    await openReady(member, app.url)
    await member.getByTestId('campaign-card').filter({ hasText: CAMPAIGN }).getByText('You have logged 1 of').waitFor()
    await member.screenshot({ path: artifact('campaign-member-home.png'), fullPage: true })
  })

  it('another member joins with the code and logs an evening too', async () => {
    const code = (await leader.getByTestId('join-code').textContent())!.trim()
    const member = await tabletPage()
    await signIn(member, DEMO.learner)
    await openReady(member, `${app.url}/groups`)
    await member.getByLabel('Join code').fill(code)
    await member.getByRole('button', { name: 'Join', exact: true }).tap()
    await member.getByText(`Welcome to ${GROUP}`).waitFor()
    await logFromCard(member, '72', '238')
  })

  it('the leader sees the grid fill in, compares the class and comments on an evening', async () => {
    await openReady(leader, campaignUrl)
    const grid = leader.getByTestId('progress-grid')
    await grid.waitFor()
    expect(await grid.getByRole('link', { name: /: measured$/ }).count()).toBe(2)
    expect(await grid.getByRole('link', { name: 'Pip', exact: true }).count()).toBe(1)
    expect(await grid.getByRole('link', { name: 'Juno Marsh-Ellery', exact: true }).count()).toBe(1)
    await leader.screenshot({ path: artifact('campaign-grid.png'), fullPage: true })
    await leader.setViewportSize({ width: 390, height: 844 })
    await leader.screenshot({ path: artifact('campaign-grid-phone.png'), fullPage: true })
    await leader.setViewportSize(TABLET.viewport)

    await leader.getByRole('tab', { name: 'Class comparison' }).tap()
    await leader.getByTestId('class-comparison').waitFor()
    await leader.screenshot({ path: artifact('campaign-comparison.png'), fullPage: true })

    await leader.getByRole('tab', { name: 'Progress' }).tap()
    await grid.getByRole('link', { name: /^Pip, .*: measured$/ }).tap()
    await leader.getByRole('heading', { name: 'Pip: campaign series' }).waitFor()
    await leader.waitForSelector('html[data-hydrated="true"]', { state: 'attached' })
    await leader.getByLabel('Comment').fill('Good first reading: keep the compass level.')
    await leader.getByRole('button', { name: 'Comment', exact: true }).tap()
    await leader.getByText('Good first reading: keep the compass level.').waitFor()
    await leader.screenshot({ path: artifact('campaign-member-series.png'), fullPage: true })
  })
})
