// The author's long sheet on a desktop and on a 390 px phone: an outline to jump between blocks,
// the caution once, the critical time step only under the solve that found the highest mode, one
// chart per mode for a model with many DOFs, and a page no wider than the phone's screen.
// Screenshots: test-results/screenshots/sheet-layout-1280.png and sheet-layout-390.png.
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import {
  RUN,
  addBlock,
  block,
  newSheet,
  useAuthorBrowser,
  waitForResults,
  waitSaved,
} from './editor-helpers';

const CAUTION_START = 'Results must be verified by a qualified engineer';

describe('sheet editor: a long sheet on desktop and phone (browser)', () => {
  const session = useAuthorBrowser();

  it('gives a long sheet an outline, one caution, Δt_cr only where asked, one chart per mode, and fits a phone', async () => {
    const { page } = session();
    await page.setViewportSize({ width: 1280, height: 860 });
    await newSheet(page, `E2E-L${RUN}`, 'Deck and frame, long sheet');
    await addBlock(page, 'text', '## Deck and frame\n\nA fine beam mesh and a short storey chain.');
    await addBlock(
      page,
      'calc',
      [
        'deck = beam({E: 210 GPa, I: 0.012 m^4, mass: 1.2 t/m, length: 32 m, elements: 60, ends: "pinned-pinned"})  # a fine mesh of the span',
        'frame = storey_chain([20 t, 20 t, 20 t], [30 kN/mm, 30 kN/mm, 30 kN/mm])',
      ].join('\n'),
    );
    const spanIndex = await addBlock(
      page,
      'modes',
      ['name: span', 'stiffness: deck.K', 'mass: deck.M', 'method: inverse', 'count: 4'].join('\n'),
    );
    const topIndex = await addBlock(
      page,
      'modes',
      ['name: top', 'stiffness: frame.K', 'mass: frame.M', 'method: forward', 'count: 1'].join(
        '\n',
      ),
    );
    await addBlock(page, 'criteria', 'span.f[1] >= 3 Hz  # walking comfort (common practice)');
    await waitForResults(page, 90_000);
    await waitSaved(page);

    // The outline: six blocks (the new sheet's empty text block first), folded; open it and jump to the second modes block.
    const outline = page.getByRole('navigation', { name: 'Outline of the sheet' });
    await outline.getByText('Outline').click();
    await outline.getByRole('link', { name: /Modes\s+top/ }).click();
    expect(new URL(page.url()).hash).toMatch(/^#block-b[0-9a-f]+$/);
    const topBlock = block(page, topIndex, 'modes');
    await expect.poll(async () => (await topBlock.boundingBox())?.y ?? -1).toBeLessThan(400);

    // The caution once on the screen (DESIGN §12).
    expect(await page.getByText(CAUTION_START).count()).toBe(1);

    // Δt_cr = 2/ω_max only under the forward solve. Closed form of the three-storey uniform
    // chain (REFERENCES.md item 2): ω₃² = (4k/m) sin²(5π/14), k = 3e7 N/m, m = 2e4 kg.
    const dt = page.getByText(/Critical time step/);
    expect(await dt.count()).toBe(1);
    const omega3 = Math.sqrt(((4 * 3e7) / 2e4) * Math.sin((5 * Math.PI) / 14) ** 2);
    const shown = Number(
      /=\s*([\d.]+)\s*s/.exec(await topBlock.getByText(/Critical time step/).innerText())?.[1],
    );
    // Four significant figures on screen: within 0.05 %.
    expect(Math.abs(shown - 2 / omega3) / (2 / omega3)).toBeLessThan(5e-4);

    // 61 nodes along the span: each of the four modes in its own chart.
    const charts = block(page, spanIndex, 'modes').getByRole('list', {
      name: 'One chart per mode',
    });
    expect(await charts.getByRole('listitem').count()).toBe(4);
    await saveScreenshot(page, 'sheet-layout-1280');

    // A phone: nothing wider than the screen, the modes table scrolls in its own box, the
    // sticky header is a small part of the screen.
    await page.setViewportSize({ width: 390, height: 844 });
    await page.evaluate(() => window.scrollTo(0, 0));
    await expect
      .poll(() => page.evaluate(() => document.documentElement.scrollWidth))
      .toBeLessThanOrEqual(390);
    const box = page.getByRole('region', { name: 'Modes of span (scrolls sideways)' });
    const { scrollWidth, clientWidth } = await box.evaluate((el) => ({
      scrollWidth: el.scrollWidth,
      clientWidth: el.clientWidth,
    }));
    expect(scrollWidth).toBeGreaterThan(clientWidth);
    await box.evaluate((el) => el.scrollTo({ left: el.scrollWidth }));
    await expect
      .poll(() =>
        box.getByRole('columnheader', { name: 'Iterations' }).evaluate((th) => {
          const r = th.getBoundingClientRect();
          return r.right <= window.innerWidth;
        }),
      )
      .toBe(true);
    const header = await page
      .getByRole('heading', { level: 1 })
      .locator('..')
      .locator('..')
      .boundingBox();
    expect(header!.height).toBeLessThan(844 / 6);
    await saveScreenshot(page, 'sheet-layout-390');
  });
});
