/**
 * Smaller defects from the members' side issue, each through the real page and control:
 * a refused promo code keeps the membership fields; editors are told the owner manages owner
 * pages; "Publish again" waits for the warnings' acknowledgement.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { BASE, DEMO, signedIn } from '../helpers/api-client';
import { launchBrowser } from '../helpers/browser';
import { createSmallClass } from '../helpers/published-class';
import { signedInContext } from '../helpers/role-pages';

let browser: Browser;
let dir: string;
let lessonId = '';

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'roundmark-small-'));
  const coach = await signedIn(DEMO.coach);
  // The small class is advertised at 1 minute for 12 s of class, so the check warns about its length.
  const cls = await createSmallClass(coach, dir, `Warned class ${Date.now()}`);
  const res = await coach.post(`/api/lessons/${cls.lessonId}/publish`, { acknowledgeWarnings: true });
  if (res.status !== 201) throw new Error(`publish failed: ${res.status}`);
  lessonId = cls.lessonId;
  browser = await launchBrowser();
}, 360_000);
afterAll(async () => {
  await browser?.close();
  await rm(dir, { recursive: true, force: true });
});

describe('smaller defects', () => {
  it('a refused promo code keeps the price, trial and grace fields as they were', async () => {
    const { context, page } = await signedInContext(browser, 'owner', { width: 1366, height: 900 });
    await page.goto(BASE() + '/studio/billing');
    const fields = ['Monthly price', 'Free trial (days)', 'Grace after a failed payment (days)'];
    const before = await Promise.all(fields.map((f) => page.getByLabel(f, { exact: false }).first().inputValue()));
    expect(before.every((v) => v !== '')).toBe(true);
    await page.getByLabel('Code', { exact: true }).fill('NOPE');
    await page.getByLabel('Percent off').fill('0'); // below the 1 % minimum: refused
    await page.getByRole('button', { name: 'Create code' }).click();
    await page.getByRole('alert').waitFor();
    const after = await Promise.all(fields.map((f) => page.getByLabel(f, { exact: false }).first().inputValue()));
    expect(after).toEqual(before);
    expect(await page.getByLabel('Code', { exact: true }).inputValue()).toBe('NOPE'); // what was typed stays
    await context.close();
  });

  it('an editor opening an owner page is told the studio owner manages it', async () => {
    const { context, page } = await signedInContext(browser, 'editor', { width: 1366, height: 900 });
    for (const path of ['/studio/members', '/studio/billing', '/studio/team']) {
      const res = await page.goto(BASE() + path);
      expect(res?.status()).toBe(403);
      expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe('The studio owner manages this');
      expect(await page.getByTestId('forbidden').textContent()).not.toContain('for studio staff');
    }
    await context.close();
  });

  it('"Publish again" stays disabled until the warnings are acknowledged', async () => {
    const { context, page } = await signedInContext(browser, 'coach', { width: 1366, height: 900 });
    await page.goto(BASE() + `/studio/classes/${lessonId}`);
    const publish = page.getByRole('button', { name: 'Publish again' });
    const acknowledge = page.getByLabel(/I reviewed these warnings/);
    await acknowledge.waitFor();
    expect(await publish.isDisabled()).toBe(true);
    await acknowledge.check();
    expect(await publish.isEnabled()).toBe(true);
    await acknowledge.uncheck();
    expect(await publish.isDisabled()).toBe(true);
    await acknowledge.check();
    await publish.click();
    await page.waitForURL(/published=/);
    expect(await page.getByTestId('publish-panel').getByRole('status').textContent()).toMatch(/version 2/i);
    await context.close();
  });
});
