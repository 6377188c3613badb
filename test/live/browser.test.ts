import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import YAML from 'yaml';
import { DESIGNS_DIR, REPO } from '../helpers/demo.js';
import { CHROMIUM, CHROMIUM_FLAGS, chromiumAvailable, freshProfile, startLive, type RunningLive } from '../helpers/live.js';
import { yamlComments as comments } from '../helpers/yaml.js';

/**
 * The live page in a real browser (Debian's Chromium driven by playwright-core): it loads the demo,
 * follows edits, refuses bad values, zooms to findings and reloads when the file changes on disk.
 * Screenshots land in out/live/.
 */

const SHOTS = join(REPO, 'out', 'live');

/** The demo's wheelbase as its file gives it, and the file with another one (the key's text replaced in place). */
const DEMO_WB = (YAML.parse(readFileSync(join(DESIGNS_DIR, 'tessel-5.yaml'), 'utf8')) as { layout: { wheelbaseMm: number } }).layout.wheelbaseMm;
const withWheelbase = (text: string, mm: number): string => text.replace(/wheelbaseMm: [\d.]+/, `wheelbaseMm: ${mm}`);


/** Plan view, front up: a motor at frame (x, y) is drawn at screen (−y, −x). For a square X layout of
 * wheelbase W every motor is W/2 from the centre at 45°, so |screen x| = W/2 · sin 45° (hand geometry). */
const propScreenX = (wheelbaseMm: number): number => (wheelbaseMm / 2) * Math.sin(Math.PI / 4);

const run = chromiumAvailable();

describe.runIf(run)('live page in Chromium', () => {
  let dir: string;
  let design: string;
  let live: RunningLive;
  let context: BrowserContext;
  let page: Page;
  let profile: { dir: string; remove: () => void };
  const consoleErrors: string[] = [];
  const original = readFileSync(join(DESIGNS_DIR, 'tessel-5.yaml'), 'utf8');

  beforeAll(async () => {
    mkdirSync(SHOTS, { recursive: true });
    dir = mkdtempSync(join(tmpdir(), 'fw-live-'));
    design = join(dir, 'tessel-5.yaml');
    copyFileSync(join(DESIGNS_DIR, 'tessel-5.yaml'), design);
    live = await startLive(design);
    profile = freshProfile();
    context = await chromium.launchPersistentContext(profile.dir, { executablePath: CHROMIUM, headless: true, args: CHROMIUM_FLAGS, viewport: { width: 1440, height: 900 } });
    page = context.pages()[0] ?? (await context.newPage());
    page.on('console', (m) => {
      if (m.type() === 'error') consoleErrors.push(m.text());
    });
    page.on('pageerror', (e) => consoleErrors.push(String(e)));
    await page.goto(live.url);
  });

  afterAll(async () => {
    await context?.close();
    profile?.remove();
    await live?.stop();
    rmSync(dir, { recursive: true, force: true });
  });

  const propX = async (site: string): Promise<number> => Number(await page.locator(`[data-view="plan"] circle.prop[data-site="${site}"]`).getAttribute('cx'));
  const wheelbase = () => page.locator('[id="f-layout.wheelbaseMm"]');

  it('loads the demo design: plates, props, parts, findings and the form', async () => {
    await expect.poll(() => page.locator('[data-view="plan"] path.plate').count()).toBeGreaterThan(8);
    expect(await page.locator('[data-view="plan"] circle.prop').count()).toBe(4);
    // Tessel 5: bottom plate, arm, top plate, brace, camera side.
    expect(await page.locator('#parts figure.part-card').count()).toBe(5);
    const model = (await (await fetch(`${live.url}api/model`)).json()) as { findings: unknown[] };
    expect(await page.locator('#findings li.finding').count()).toBe(model.findings.length);
    expect(await wheelbase().inputValue()).toBe(String(DEMO_WB));
    expect(Math.abs(await propX('front-left'))).toBeCloseTo(propScreenX(DEMO_WB), 3);
    await page.screenshot({ path: join(SHOTS, '1-loaded.png') });
  });

  it('hovering a plate names it with its thickness and mass', async () => {
    // A point of the plate's material (not a hole) that no higher item covers, in screen pixels.
    const at = await page.evaluate(() => {
      const path = document.querySelector('[data-view="plan"] path.plate[data-part="top-plate"]') as SVGPathElement;
      const box = path.getBBox();
      const ctm = path.getScreenCTM()!;
      for (let i = 1; i < 40; i++) {
        for (let j = 1; j < 40; j++) {
          const p = new DOMPoint(box.x + (box.width * i) / 40, box.y + (box.height * j) / 40);
          if (!path.isPointInFill(p)) continue;
          const q = p.matrixTransform(ctm);
          if (document.elementFromPoint(q.x, q.y) === path) return { x: q.x, y: q.y };
        }
      }
      return null;
    });
    expect(at).not.toBeNull();
    await page.mouse.move(at!.x, at!.y);
    const tip = page.locator('#tooltip');
    await expect.poll(() => tip.isVisible()).toBe(true);
    const model = (await (await fetch(`${live.url}api/model`)).json()) as { parts: Array<{ name: string; thicknessMm: number; massG: number }> };
    const top = model.parts.find((p) => p.name === 'top-plate')!;
    expect(await tip.textContent()).toBe(`top-plate — ${top.thicknessMm.toFixed(1)} mm woven-cf, ${top.massG.toFixed(1)} g each, ×1`);
    await page.mouse.move(2, 2);
  });

  it('a wheelbase edit redraws the outline and rewrites the file with its comments intact', async () => {
    const armBefore = await page.locator('[data-view="plan"] path.plate[data-part="arm"]').first().getAttribute('d');
    await wheelbase().fill('240');
    await wheelbase().press('Enter');
    await expect.poll(() => page.locator('#status').textContent()).toMatch(/^saved/);
    await expect.poll(async () => Math.abs(await propX('front-left'))).toBeCloseTo(propScreenX(240), 3);
    expect(await page.locator('[data-view="plan"] path.plate[data-part="arm"]').first().getAttribute('d')).not.toBe(armBefore);
    const onDisk = readFileSync(design, 'utf8');
    // Only the value changed: every other byte (comments, order, flow lists) is as it was.
    expect(onDisk).toBe(withWheelbase(original, 240));
    expect(comments(onDisk)).toEqual(comments(original));
    await page.screenshot({ path: join(SHOTS, '2-wheelbase-240.png') });
  });

  it('an invalid value shows its error beside the field and leaves the file untouched', async () => {
    const before = readFileSync(design, 'utf8');
    await wheelbase().fill('5');
    await wheelbase().press('Enter');
    const error = page.locator('[data-path="layout.wheelbaseMm"] .error');
    await expect.poll(() => error.isVisible()).toBe(true);
    expect(await error.textContent()).toMatch(/60 to 1000/);
    expect(readFileSync(design, 'utf8')).toBe(before);
    await page.screenshot({ path: join(SHOTS, '3-invalid-wheelbase.png') });
    await page.keyboard.press('Escape');
    await expect.poll(() => error.isVisible()).toBe(false);
    expect(await wheelbase().inputValue()).toBe('240');
    expect(readFileSync(design, 'utf8')).toBe(before);
  });

  it('a click on a finding zooms the pictures to it', async () => {
    const box = async (view: string): Promise<number[]> => ((await page.locator(`svg[data-view="${view}"]`).getAttribute('viewBox')) ?? '').split(' ').map(Number);
    const first = page.locator('#findings li.finding').first();
    const part = ((await first.locator('.where').textContent()) ?? '').split(' · ')[0];
    const planBefore = await box('plan');
    const partBefore = await box(`part:${part}`);
    await first.locator('button').click();
    const planAfter = await box('plan');
    const partAfter = await box(`part:${part}`);
    expect(planAfter[2]).toBeLessThan(planBefore[2] / 2);
    expect(partAfter[2]).toBeLessThan(partBefore[2]);
    expect(await page.locator('[data-view="plan"] .marker.selected').count()).toBeGreaterThan(0);
    await page.screenshot({ path: join(SHOTS, '4-finding-zoom.png') });
    await page.keyboard.press('Escape');
  });

  it('an edit of the file on disk reloads the page', async () => {
    const text = withWheelbase(readFileSync(design, 'utf8'), 250);
    // As editors save: a new file renamed over the old one.
    writeFileSync(`${design}.tmp`, text);
    renameSync(`${design}.tmp`, design);
    await expect.poll(() => wheelbase().inputValue(), { timeout: 10_000 }).toBe('250');
    expect(Math.abs(await propX('front-left'))).toBeCloseTo(propScreenX(250), 3);
    expect(await page.locator('#status').textContent()).toContain('reloaded');
    await page.screenshot({ path: join(SHOTS, '5-reloaded-from-disk.png') });
  });

  it('a change that needs two fields at once (truss arms to straight ones) is held until it builds', async () => {
    const before = readFileSync(design, 'utf8');
    await page.locator('[id="f-arms.style"]').selectOption('straight');
    const widthError = page.locator('[data-path="arms.widthMm"] .error');
    await expect.poll(() => widthError.isVisible()).toBe(true);
    expect(await widthError.textContent()).toMatch(/required for straight arms/);
    expect(readFileSync(design, 'utf8')).toBe(before);
    await page.locator('[id="f-arms.widthMm"]').fill('12');
    await page.locator('[id="f-arms.widthMm"]').press('Enter');
    await expect.poll(() => readFileSync(design, 'utf8')).not.toBe(before);
    const after = YAML.parse(readFileSync(design, 'utf8')) as { arms: { style: string; widthMm: number } };
    expect([after.arms.style, after.arms.widthMm]).toEqual(['straight', 12]);
    expect(comments(readFileSync(design, 'utf8'))).toEqual(comments(before));
    await page.screenshot({ path: join(SHOTS, '6-straight-arms.png') });
  });

  it('a layout kind change keeps the motors where they were', async () => {
    const before = await propX('front-left');
    await page.locator('[id="f-layout.kind"]').selectOption('asymmetric');
    await expect.poll(() => (YAML.parse(readFileSync(design, 'utf8')) as { layout: { kind: string } }).layout.kind).toBe('asymmetric');
    await expect.poll(() => page.locator('[id="f-layout.front.reachMm"]').count()).toBe(1);
    expect(await propX('front-left')).toBeCloseTo(before, 1);
  });

  it('works from the keyboard: Tab reaches a finding, Enter zooms to it', async () => {
    await page.keyboard.press('Escape');
    const button = page.locator('#findings li.finding button').nth(1);
    await button.focus();
    const before = ((await page.locator('svg[data-view="plan"]').getAttribute('viewBox')) ?? '').split(' ').map(Number);
    await page.keyboard.press('Enter');
    expect(await button.getAttribute('aria-pressed')).toBe('true');
    const after = ((await page.locator('svg[data-view="plan"]').getAttribute('viewBox')) ?? '').split(' ').map(Number);
    expect(after[2]).toBeLessThan(before[2]);
    // `/` jumps to the field filter; typing narrows the form.
    await page.locator('body').press('/');
    await page.keyboard.type('wheel');
    await expect.poll(() => page.locator('.field:not([hidden])').count()).toBeLessThan(5);
  });

  it('logged no console errors', () => {
    expect(consoleErrors).toEqual([]);
  });
});
