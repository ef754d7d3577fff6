/**
 * The run page in a real headless chromium, against the real server (embedded broker, archive,
 * live engine) fed by the demo scenario's devices over MQTT: figures from the state with their
 * units, live updates without a reload, logging and ending a measure from the form, the runs
 * list, and a phone-sized screen. Expected texts are written out here from the state's numbers
 * (toFixed and the unit), not produced by the dashboard's own formatters.
 */
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runRoom } from '../../../server/src/api/liveSocket.ts';
import type { RunState } from '../../../server/src/live/types.ts';
import { startDashboardRig } from '../_dashboardRig.ts';
import type { DashboardRig } from '../_dashboardRig.ts';

/** The scenario's offset (+02:00), min: the page shows times on the site's clock. */
const SITE_OFFSET_MIN = 120;
const NBSP = '\u00a0';

/** A number as the page should show it: fixed decimals, no minus on a rounded zero. */
function fixed(value: number | null, decimals: number): string {
  if (value === null) throw new Error('the state has no value for a figure the test reads');
  const text = value.toFixed(decimals);
  return /^-0\.0+$/.test(text) ? text.slice(1) : text;
}

/** "HH:MM" on the site's clock. */
function siteClock(timeMs: number): string {
  return new Date(timeMs + SITE_OFFSET_MIN * 60_000).toISOString().slice(11, 16);
}

/** The figures the page must show for a state, by their `data-figure` names. */
function expectedFigures(state: RunState): Record<string, string> {
  return {
    utilization: fixed(state.utilization, 2),
    margin: `${fixed(state.marginMPa, 2)}${NBSP}MPa`,
    'stress-strength': `${fixed(state.surfaceStressMPa, 2)}${NBSP}MPa of ${fixed(state.fctmMPa, 2)}${NBSP}MPa`,
    evaporation: `${fixed(state.evaporationKgM2h, 2)}${NBSP}kg/m²/h`,
    'bleed-film': `${fixed(state.bleedFilmKgM2, 2)}${NBSP}kg/m²`,
    compressive: `${fixed(state.inPlaceCompressiveStrengthMPa, 1)}${NBSP}MPa`,
  };
}

/** The figures the page shows now. */
async function shownFigures(page: Page): Promise<Record<string, string>> {
  return page.$$eval('[data-figure]', (nodes) =>
    Object.fromEntries(
      nodes.map((node) => [node.getAttribute('data-figure') ?? '', node.textContent ?? '']),
    ),
  );
}

let rig: DashboardRig;
let pages: Page[] = [];

async function openRunPage(width = 1280, height = 900): Promise<Page> {
  const page = await rig.browser.newPage();
  pages.push(page);
  await page.setViewportSize({ width, height });
  await page.goto(rig.runUrl);
  await page.waitForSelector('[data-figure="utilization"]');
  return page;
}

beforeAll(async () => {
  rig = await startDashboardRig();
  // Past final set (about 15:00 in this scenario), so stress, strength and margin are defined.
  await rig.playUntil(rig.siteTimeMs('15:40'));
}, 240_000);

afterAll(async () => {
  for (const page of pages) await page.close();
  pages = [];
  await rig?.close();
});

describe('the run page', () => {
  it('shows the run: name, site, placed at with its offset, phase and the time of the figures', async () => {
    const page = await openRunPage();
    const state = await rig.apiJson<RunState>(`/runs/${rig.runId}/state`);
    const run = await rig.apiJson<{ name: string; site: string }>(`/runs/${rig.runId}`);
    expect(await page.textContent('h1')).toBe(run.name);
    const header = (await page.textContent('#run-header')) ?? '';
    expect(header).toContain(run.site);
    expect(await page.textContent('#placed-at')).toBe('2026-07-16 11:15 (UTC+02:00)');
    expect(state.phase).toBe('hardening');
    expect(await page.textContent('#phase')).toBe('hardening (after final set)');
    expect(await page.textContent('#event-time')).toContain(
      `2026-07-16 ${siteClock(state.eventTimeMs ?? 0)} (UTC+02:00`,
    );
    expect(await page.textContent('#caution')).toContain(state.caution);
  });

  it('shows every figure of the state with its unit, and the run thresholds on the utilization gauge', async () => {
    const page = await openRunPage();
    const state = await rig.apiJson<RunState>(`/runs/${rig.runId}/state`);
    expect(await shownFigures(page)).toEqual(expectedFigures(state));
    const marks = await page.$$eval('#gauge-utilization .meter-mark-label', (nodes) =>
      nodes.map((node) => node.textContent),
    );
    expect(marks).toEqual(['0.57', '0.69', '1.00']);
    const crossings = (await page.textContent('#crossings')) ?? '';
    expect(crossings).toMatch(/Utilization 0\.57: /);
    expect(crossings).toMatch(/Utilization 1\.00: /);
  });

  it('draws the history, outlook and saturation plots and the probe table', async () => {
    const page = await openRunPage();
    for (const chart of ['#history-chart', '#outlook-chart', '#saturation-chart'])
      expect(await page.locator(`${chart} canvas`).count(), chart).toBe(1);
    const state = await rig.apiJson<RunState>(`/runs/${rig.runId}/state`);
    const rows = await page.locator('#probe-table tbody tr').count();
    expect(rows).toBe(state.profiles?.probes.length);
  });

  it('follows a state push without a reload', async () => {
    const page = await openRunPage();
    await page.evaluate(() => Object.assign(window, { loadedOnce: true }));
    const before = await rig.apiJson<RunState>(`/runs/${rig.runId}/state`);
    await rig.playUntil(rig.siteTimeMs('16:10'));
    await expect
      .poll(
        async () => {
          const state = await rig.apiJson<RunState>(`/runs/${rig.runId}/state`);
          return {
            figures: await shownFigures(page),
            eventTime: (await page.textContent('#event-time'))?.slice(11, 16),
            expectedFigures: expectedFigures(state),
            expectedTime: siteClock(state.eventTimeMs ?? 0),
          };
        },
        { timeout: 20_000, interval: 250 },
      )
      .toSatisfy(
        (shown: {
          figures: unknown;
          eventTime: string | undefined;
          expectedFigures: unknown;
          expectedTime: string;
        }) =>
          JSON.stringify(shown.figures) === JSON.stringify(shown.expectedFigures) &&
          shown.eventTime === shown.expectedTime,
      );
    const after = await rig.apiJson<RunState>(`/runs/${rig.runId}/state`);
    expect(after.eventTimeMs).toBeGreaterThan(before.eventTimeMs ?? Infinity);
    expect(await page.evaluate(() => (window as { loadedOnce?: boolean }).loadedOnce)).toBe(true);
  });

  it('catches up after the live link drops: reconnects, says so meanwhile, and refetches the state it missed', async () => {
    const page = await openRunPage();
    await expect.poll(() => page.getAttribute('#connection', 'data-status')).toBe('live');
    const statuses: string[] = [];
    await page.exposeFunction('recordStatus', (status: string) => statuses.push(status));
    await page.evaluate(() => {
      const target = document.getElementById('connection');
      if (target === null) return;
      new MutationObserver(() => {
        void (window as unknown as { recordStatus(status: string): Promise<void> }).recordStatus(
          target.dataset.status ?? '',
        );
      }).observe(target, { attributes: true, attributeFilter: ['data-status'] });
    });
    // The page goes offline and the server closes its socket (on purpose: socket.io does not
    // retry that by itself); the play moves on while the page cannot hear it.
    const shownBefore = await shownFigures(page);
    await page.context().setOffline(true);
    rig.server.io.disconnectSockets(true);
    await expect.poll(() => page.getAttribute('#connection', 'data-status')).toBe('reconnecting');
    expect(await page.textContent('#connection')).toContain('Figures may be out of date');
    const moved = await rig.playUntil(rig.siteTimeMs('16:30'));
    expect(await shownFigures(page)).toEqual(shownBefore);
    await page.context().setOffline(false);
    await expect
      .poll(
        async () => {
          const state = await rig.apiJson<RunState>(`/runs/${rig.runId}/state`);
          const shown = {
            status: await page.getAttribute('#connection', 'data-status'),
            figures: await shownFigures(page),
            time: (await page.textContent('#event-time'))?.slice(11, 16),
          };
          const expected = {
            status: 'live',
            figures: expectedFigures(state),
            time: siteClock(state.eventTimeMs ?? 0),
          };
          return JSON.stringify(shown) === JSON.stringify(expected) ? 'caught up' : shown;
        },
        { timeout: 20_000, interval: 250 },
      )
      .toBe('caught up');
    expect(moved.eventTimeMs).toBeGreaterThan(rig.siteTimeMs('16:10'));
    expect(statuses).toContain('reconnecting');
  });

  it('logs a measure from the form at the time of the latest figures (this run is not live), then ends it', async () => {
    const page = await openRunPage();
    const state = await rig.apiJson<RunState>(`/runs/${rig.runId}/state`);
    // The demo's July readings are months from this machine's clock: "now" is their time.
    const eventAt = new Date(state.eventTimeMs ?? 0).toISOString();
    await page.selectOption('#measure-kind', 'fogging');
    await page.fill('#measure-by', 'Site engineer (browser test)');
    await page.click('#measure-form button[type="submit"]');
    type Measures = {
      measures: { kind: string; loggedBy: string; startAt: string; endAt: string | null }[];
    };
    const measures = async () =>
      (await rig.apiJson<Measures>(`/runs/${rig.runId}/measures`)).measures;
    await expect.poll(measures, { timeout: 10_000 }).toEqual([
      expect.objectContaining({
        kind: 'fogging',
        loggedBy: 'Site engineer (browser test)',
        startAt: eventAt,
        endAt: null,
      }),
    ]);
    await expect
      .poll(() => page.textContent('#measure-form .form-message'))
      .toBe(
        `Logged: fogging by Site engineer (browser test), from 2026-07-16 ${siteClock(state.eventTimeMs ?? 0)}.`,
      );
    const row = page.locator('#measure-table tbody tr');
    await expect.poll(() => row.count()).toBe(1);
    expect(await row.first().textContent()).toContain('still applied');
    await row.first().locator('button', { hasText: 'End now' }).click();
    await expect.poll(async () => (await measures())[0]?.endAt).toBe(eventAt);
    await expect.poll(() => row.first().textContent()).not.toContain('still applied');
    expect(await row.first().textContent()).toContain(
      `${siteClock(state.eventTimeMs ?? 0)} (Site engineer (browser test))`,
    );
  });

  it('fits a phone: no sideways scrolling, the level and figures on top, the caution always in sight', async () => {
    const page = await openRunPage(390, 844);
    const widths = await page.evaluate(() => ({
      scroll: document.documentElement.scrollWidth,
      client: document.documentElement.clientWidth,
    }));
    expect(widths.scroll).toBeLessThanOrEqual(widths.client);
    const banner = await page.locator('#notice-banner').boundingBox();
    expect(banner?.y).toBeLessThan(844);
    for (const scrollY of [0, 2000, 100_000]) {
      await page.evaluate((y) => window.scrollTo(0, y), scrollY);
      const caution = await page.locator('#caution').boundingBox();
      expect(caution).not.toBeNull();
      expect((caution?.y ?? -1) + (caution?.height ?? 0)).toBeLessThanOrEqual(844 + 0.5);
      expect(caution?.y).toBeGreaterThanOrEqual(0);
    }
    for (const chart of ['#history-chart', '#outlook-chart']) {
      const box = await page.locator(`${chart} canvas`).boundingBox();
      expect(box?.width, chart).toBeLessThanOrEqual(390);
    }
  });
});

/** A notice as the test reads it from GET /api/runs/:id/notices. */
interface NoticeJson {
  id: string;
  seq: number;
  level: string;
  kind: string;
  conditionKey?: string;
  title: string;
  acknowledgedBy: string | null;
}

const LEVEL_ORDER = ['NOTE', 'PREPARE', 'ACT NOW', 'CRACKING LIKELY'];

/**
 * The level the page must show on top, worked out here on its own: the newest notice of each
 * concern, then the most urgent of those (the newest among equals).
 */
function expectedTopNotice(notices: readonly NoticeJson[]): NoticeJson | undefined {
  const newest = new Map<string, NoticeJson>();
  for (const notice of notices) {
    const key = notice.conditionKey ?? notice.kind;
    if ((newest.get(key)?.seq ?? -1) < notice.seq) newest.set(key, notice);
  }
  return [...newest.values()].sort(
    (a, b) => LEVEL_ORDER.indexOf(b.level) - LEVEL_ORDER.indexOf(a.level) || b.seq - a.seq,
  )[0];
}

describe('crew notices on the run page', () => {
  it("shows the run's crew notices: the level on top in words with its title, every notice newest first, and acknowledges one", async () => {
    const page = await openRunPage();
    type Notices = { notices: NoticeJson[] };
    const { notices } = await rig.apiJson<Notices>(`/runs/${rig.runId}/notices`);
    // Without measures, the scenario's margin closes in the afternoon: the server has warned.
    expect(notices.length).toBeGreaterThan(0);
    const top = expectedTopNotice(notices);
    await expect.poll(() => page.textContent('#notice-level')).toBe(top?.level);
    expect(await page.textContent('#notice-title')).toBe(top?.title);
    expect(await page.title()).toMatch(new RegExp(`^${top?.level ?? ''} - Ferngate parking deck`));
    const listed = await page.$$eval('#notice-list li.notice', (items) =>
      items.map((item) => item.id),
    );
    expect(listed).toEqual(notices.map((notice) => `notice-${notice.id}`));
    const open = notices.find((notice) => notice.acknowledgedBy === null);
    expect(open, 'a notice not yet acknowledged').toBeDefined();
    const form = page.locator(`#notice-${open?.id ?? ''} form.ack-form`);
    await form.locator('input').fill('Crew lead (browser test)');
    await form.locator('button', { hasText: 'Acknowledge' }).click();
    await expect
      .poll(async () => {
        const after = await rig.apiJson<Notices>(`/runs/${rig.runId}/notices`);
        return after.notices.find((notice) => notice.id === open?.id)?.acknowledgedBy;
      })
      .toBe('Crew lead (browser test)');
    await expect
      .poll(() => page.textContent(`#notice-${open?.id ?? ''} .acknowledged`))
      .toMatch(/^Acknowledged by Crew lead \(browser test\) at \d\d:\d\d\.$/);
  });

  it('shows a pushed `notice` event at once: the level in words on top with its title, the text and each delivery', async () => {
    const page = await openRunPage();
    // A notice as the contract describes it, pushed through the server's own socket.io room.
    // CRACKING LIKELY on a concern of its own, so it is the level on top whatever else is raised.
    const raisedAtMs = rig.siteTimeMs('15:35');
    const notice = {
      id: `n-${rig.runId}-900`,
      runId: rig.runId,
      seq: 900,
      level: 'CRACKING LIKELY',
      kind: 'utilization',
      conditionKey: 'browser-test',
      raisedAtMs,
      title: 'CRACKING LIKELY: protect the surface now',
      text: 'Utilization has reached 1.02.\nFog or cover bays C4 to C7 now.',
      figures: {
        utilization: 1.02,
        marginMPa: -0.01,
        evaporationKgM2h: 1.76,
        expectedClosingMs: null,
        probabilityCracking: 0.84,
      },
      deliveries: [
        {
          channel: 'email',
          recipient: 'crew.lead@example.org',
          status: 'failed',
          attempts: 2,
          lastAttemptMs: raisedAtMs + 60_000,
          error: 'connection refused',
        },
      ],
      acknowledgedAtMs: null,
      acknowledgedBy: null,
    };
    rig.server.io.to(runRoom(rig.runId)).emit('notice', notice);
    await expect.poll(() => page.textContent('#notice-level')).toBe('CRACKING LIKELY');
    const banner = (await page.textContent('#notice-banner')) ?? '';
    expect(banner).toContain('utilization at or above 1, now or very soon');
    expect(banner).toContain(notice.title);
    expect(banner).toContain('raised at 15:35');
    const item = page.locator(`#notice-${notice.id}`);
    const text = (await item.textContent()) ?? '';
    expect(text).toContain('Fog or cover bays C4 to C7 now.');
    expect(text).toContain(
      `email to crew.lead@example.org: failed (2 tries, last try 2026-07-16 15:36)`,
    );
    expect(text).toContain('connection refused');
    expect(await item.locator('button', { hasText: 'Acknowledge' }).count()).toBe(1);
  });
});

describe('the runs list', () => {
  it('lists the run with its site, placement and status, and links to its page', async () => {
    const page = await rig.browser.newPage();
    pages.push(page);
    await page.goto(`${rig.baseUrl}/`);
    const run = await rig.apiJson<{ name: string }>(`/runs/${rig.runId}`);
    const item = page.locator('#run-list li', { hasText: run.name });
    await expect.poll(() => item.count()).toBe(1);
    const text = (await item.textContent()) ?? '';
    expect(text).toContain('Site ferngate-deck - topping 75\u00a0mm - ');
    expect(text).toContain('placed 2026-07-16 11:15 (UTC+02:00)');
    expect(text).toContain('open');
    await item.locator('a').click();
    await page.waitForURL(rig.runUrl);
    expect(await page.textContent('h1')).toBe(run.name);
  });

  it('answers an unknown run address with words and a way back', async () => {
    const page = await rig.browser.newPage();
    pages.push(page);
    await page.goto(`${rig.baseUrl}/runs/no-such-run`);
    await expect.poll(() => page.textContent('h1')).toBe('No such run');
    expect(await page.locator('a', { hasText: 'All runs' }).count()).toBe(1);
  });
});
