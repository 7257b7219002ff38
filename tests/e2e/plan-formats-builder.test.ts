// A coach builds a plan with an EMOM block and a station done per side in the Plan section of a
// new class, through the real controls in Chromium (typing, ticking the box, pressing Save), and
// the stored plan is read back through the API. Names are invented for the test.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { type ApiClient, BASE, DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser, SHOTS } from '../helpers/browser';
import { signedInPage } from '../helpers/role-pages';

let browser: Browser;
let api: ApiClient;

beforeAll(async () => {
  api = await signedIn(DEMO.coach);
  browser = await launchBrowser();
}, 60_000);

afterAll(async () => {
  await browser?.close();
});

interface StoredPlan {
  plan: {
    blocks: {
      kind: string;
      minutes?: number;
      workSeconds?: number;
      exercises?: string[];
      perSide?: boolean;
      switchSeconds?: number;
      stations?: { exercise: string; perSide?: boolean; switchSeconds?: number }[];
    }[];
  } | null;
  schedule: { totals: { classSeconds: number } } | null;
}

describe('the plan builder with the formats coaches teach', () => {
  it('builds an EMOM block and a per-side station, shows their lengths live, and saves them', async () => {
    const { context, page } = await signedInPage(browser, DEMO.coach, { viewport: { width: 1366, height: 900 } });
    const pageErrors: string[] = [];
    page.on('pageerror', (e) => pageErrors.push(e.message));
    await page.goto(BASE() + '/studio/classes');
    await page.getByLabel('Title').fill('Formats builder check');
    await page.getByLabel('Advertised length (minutes)').fill('30');
    await page.getByRole('button', { name: 'Create class' }).click();
    await page.waitForURL(/\/studio\/classes\/[0-9a-f-]{36}/);
    const lessonId = page.url().split('/').pop()!;
    const plan = page.locator('[data-plan-builder]');
    await plan.waitFor();

    // EMOM: two moves taking turns; the schema's words at the fields while they are wrong.
    await page.getByRole('button', { name: '+ EMOM' }).click();
    const emom = page.locator('[data-plan-block="emom"]');
    await expect.poll(() => emom.locator('[data-field-error]').first().textContent()).toBe('The exercise needs a name.');
    await emom.getByLabel('Exercise 1', { exact: true }).fill('Formats e2e swing');
    await emom.getByLabel('Exercise 2', { exact: true }).fill('Formats e2e burpee');
    const work = emom.getByLabel('Work each minute (s)');
    await work.fill('60');
    await expect.poll(() => emom.locator('[data-field-error]').allTextContents()).toEqual(['Work must be less than 60 seconds: what is left of the minute is the rest.']);
    await work.fill('40');
    await expect.poll(() => emom.locator('[data-field-error]').count()).toBe(0);
    // EMOM as the trade defines it (common practice, no source): 10 minutes last 10:00.
    expect(await emom.locator('[data-block-length]').textContent()).toBe('10:00');
    await emom.getByLabel('Minutes').fill('12');
    await expect.poll(() => emom.locator('[data-block-length]').textContent()).toBe('12:00');

    // A circuit whose second station is done per side with a switch pause.
    await page.getByRole('button', { name: '+ Circuit' }).click();
    const circuit = page.locator('[data-plan-block="circuit"]');
    const names = circuit.locator('[data-exercise-input]');
    await names.nth(0).fill('Formats e2e squat');
    await names.nth(1).fill('Formats e2e side lunge');
    await names.nth(2).fill('Formats e2e row');
    // 3 stations × (40 + 20) × 3 rounds, 60 s round breaks replacing the last rest, final rest dropped: 600 s.
    await expect.poll(() => circuit.locator('[data-block-length]').textContent()).toBe('10:00');
    const station2 = circuit.locator('[data-station]').nth(1);
    await station2.getByLabel('Per side').check();
    const pause = station2.getByLabel('Switch pause (s)');
    expect(await pause.inputValue()).toBe('5');
    await pause.fill('10');
    // Per round the side lunge becomes 40 s left + 10 s switch + 40 s right: +50 s, × 3 rounds = 750 s.
    await expect.poll(() => circuit.locator('[data-block-length]').textContent()).toBe('12:30');
    // Warm-up 5:00 + EMOM 12:00 + circuit 12:30 = 29:30, within 30 min ± 10 %.
    await expect.poll(() => plan.locator('[data-planned-total]').textContent()).toBe('29:30');
    expect(await plan.locator('[data-length-ok]').count()).toBe(1);
    await page.screenshot({ path: `${SHOTS}/formats-builder-desktop.png`, fullPage: true });

    await page.getByRole('button', { name: 'Save plan' }).click();
    await expect.poll(() => plan.locator('[data-plan-save-state]').getAttribute('data-plan-save-state')).toBe('saved');
    const stored = (await (await api.get(`/api/lessons/${lessonId}/plan`)).json()) as StoredPlan;
    expect(stored.plan?.blocks.map((b) => b.kind)).toEqual(['warmup', 'emom', 'circuit']);
    expect(stored.plan?.blocks[1]).toMatchObject({ minutes: 12, workSeconds: 40, exercises: ['Formats e2e swing', 'Formats e2e burpee'] });
    expect(stored.plan?.blocks[2]?.stations?.[1]).toMatchObject({ exercise: 'Formats e2e side lunge', perSide: true, switchSeconds: 10 });
    expect(stored.schedule?.totals.classSeconds).toBe(29 * 60 + 30);
    expect(pageErrors).toEqual([]);
    await context.close();
  }, 120_000);

  it('builds intervals done per side and an AMRAP with its exercises, and saves them', async () => {
    const { context, page } = await signedInPage(browser, DEMO.coach, { viewport: { width: 1366, height: 900 } });
    const pageErrors: string[] = [];
    page.on('pageerror', (e) => pageErrors.push(e.message));
    await page.goto(BASE() + '/studio/classes');
    await page.getByLabel('Title').fill('Sides and AMRAP builder check');
    await page.getByLabel('Advertised length (minutes)').fill('20');
    await page.getByRole('button', { name: 'Create class' }).click();
    await page.waitForURL(/\/studio\/classes\/[0-9a-f-]{36}/);
    const lessonId = page.url().split('/').pop()!;
    const plan = page.locator('[data-plan-builder]');
    await plan.waitFor();

    // Intervals of one move done per side: 8 sets of 20 s work and 10 s rest to start with.
    await page.getByRole('button', { name: '+ Intervals' }).click();
    const intervals = page.locator('[data-plan-block="intervals"]');
    await intervals.getByLabel('Exercise', { exact: true }).fill('Formats e2e single-leg deadlift');
    await intervals.getByLabel('Sets').fill('4');
    await intervals.getByLabel('Work (s)').fill('30');
    await intervals.getByLabel('Rest (s)').fill('20');
    // 4 × 30 + 3 × 20 (the final rest dropped by default) = 180 s, worked by hand.
    await expect.poll(() => intervals.locator('[data-block-length]').textContent()).toBe('3:00');
    await intervals.getByLabel('Per side').check();
    const pause = intervals.getByLabel('Switch pause (s)');
    expect(await pause.inputValue()).toBe('5');
    // Each set becomes left 30 + switch 5 + right 30: 4 × 65 + 3 × 20 = 320 s = 5:20.
    await expect.poll(() => intervals.locator('[data-block-length]').textContent()).toBe('5:20');
    // Keyboard: the pause field takes a typed value too.
    await pause.fill('');
    await pause.press('1');
    await pause.press('0');
    // 4 × 70 + 60 = 340 s = 5:40.
    await expect.poll(() => intervals.locator('[data-block-length]').textContent()).toBe('5:40');

    // An AMRAP whose exercises come from the studio's list (type-ahead), one new name.
    await page.getByRole('button', { name: '+ AMRAP' }).click();
    const amrap = page.locator('[data-plan-block="amrap"]');
    await amrap.getByLabel('Length (seconds)').fill('600');
    await amrap.getByLabel('Exercise 1', { exact: true }).fill('Formats e2e thruster');
    await amrap.getByLabel('Exercise 2', { exact: true }).fill('Formats e2e box step');
    await amrap.getByRole('button', { name: 'Remove exercise 3' }).click();
    await expect.poll(() => amrap.locator('[data-exercise-input]').count()).toBe(2);
    await expect.poll(() => amrap.locator('[data-block-length]').textContent()).toBe('10:00');
    // Warm-up 5:00 + intervals 5:40 + AMRAP 10:00 = 20:40, within 20 min ± 10 %.
    await expect.poll(() => plan.locator('[data-planned-total]').textContent()).toBe('20:40');

    await page.getByRole('button', { name: 'Save plan' }).click();
    await expect.poll(() => plan.locator('[data-plan-save-state]').getAttribute('data-plan-save-state')).toBe('saved');
    const stored = (await (await api.get(`/api/lessons/${lessonId}/plan`)).json()) as StoredPlan;
    expect(stored.plan?.blocks.map((b) => b.kind)).toEqual(['warmup', 'intervals', 'amrap']);
    expect(stored.plan?.blocks[1]).toMatchObject({ perSide: true, switchSeconds: 10, workSeconds: 30 });
    expect(stored.plan?.blocks[2]).toMatchObject({ exercises: ['Formats e2e thruster', 'Formats e2e box step'] });
    expect(stored.schedule?.totals.classSeconds).toBe(20 * 60 + 40);

    // After a reload the builder shows the sides again.
    await page.reload();
    await plan.waitFor();
    const reloaded = page.locator('[data-plan-block="intervals"]');
    await expect.poll(() => reloaded.getByLabel('Per side').isChecked()).toBe(true);
    expect(await reloaded.getByLabel('Switch pause (s)').inputValue()).toBe('10');
    expect(pageErrors).toEqual([]);
    await context.close();
  }, 120_000);
});
