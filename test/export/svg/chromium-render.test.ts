/**
 * Each plot rendered by headless Chromium (Debian's chromium): the SVG parses with the browser's XML
 * parser (one page runs DOMParser on every plot and reports parser errors) and the screenshot shows every series in its colour, the Monte Carlo band, the
 * mask and the clipping level; a colour that no element uses is absent (so the pixel check can fail).
 * Skipped when chromium is missing, unless CI=true.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { renderPlotSvg } from '../../../src/export/svg/render-svg';
import { BAND_COLOR, MASK_COLOR, PLOT_PALETTE, type PlotModel } from '../../../src/export/svg/plot-model';
import { haveTool, IN_CI, toolTitle } from '../helpers/toolchain';
import { CHROMIUM, screenshot, svgParseErrors } from '../helpers/chromium';
import { countColor, decodePng } from '../helpers/png';
import { samplePlots } from './sample-plots';

const HAVE_CHROMIUM = haveTool(CHROMIUM);
/** Anti-aliased 2 px strokes keep a core of nearly pure colour; 40 of 441 (the RGB diagonal) allows for blending. */
const COLOR_TOLERANCE = 40;
/** A drawn series covers hundreds of pixels; fewer than this means it is not really visible. */
const MIN_PIXELS = 60;
/** Translucent fills are exact blends with white; a small tolerance covers rounding. */
const FILL_TOLERANCE = 12;

/** The colour of `color` at `opacity` over white (source-over compositing). */
function overWhite(color: string, opacity: number): string {
  const c = [1, 3, 5].map((i) => parseInt(color.slice(i, i + 2), 16));
  return `#${c.map((v) => Math.round(255 * (1 - opacity) + v * opacity).toString(16).padStart(2, '0')).join('')}`;
}

function seriesColors(m: PlotModel): string[] {
  return m.series.map((s, i) => s.style?.color ?? PLOT_PALETTE[i % PLOT_PALETTE.length]);
}

describe.skipIf(!HAVE_CHROMIUM && !IN_CI)(toolTitle('plots rendered in headless Chromium', ['chromium'], HAVE_CHROMIUM), () => {
  const plots = Object.entries(samplePlots('evil <script>alert(1)</script> & "q" \u00fc\u65e5 \u0007'));
  const svgs = plots.map(([, model]) => renderPlotSvg(model));
  let dir = '';
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'gicladder-svg-'));
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('every plot parses as SVG in the browser; a broken one is reported (the check can fail)', async () => {
    const broken = svgs[0].replace('</svg>', '<text>a & b</text></svg>');
    const errors = await svgParseErrors([...svgs, broken], dir);
    expect(errors.slice(0, -1)).toEqual(svgs.map(() => ''));
    expect(errors.at(-1)).not.toBe('');
  });

  plots.forEach(([name, model], i) => {
    it.concurrent(`${name}: the screenshot shows its curves`, async () => {
      const file = join(dir, `${name}.svg`);
      writeFileSync(file, svgs[i]);
      const png = decodePng(await screenshot(file, model.widthPx ?? 900, model.heightPx ?? 560));
      expect(png.width).toBe(model.widthPx ?? 900);
      for (const color of seriesColors(model)) {
        expect(countColor(png, color, COLOR_TOLERANCE), `series colour ${color}`).toBeGreaterThan(MIN_PIXELS);
      }
      for (const _band of model.bands ?? []) expect(countColor(png, overWhite(BAND_COLOR, 0.35), FILL_TOLERANCE)).toBeGreaterThan(MIN_PIXELS);
      for (const m of model.masks ?? []) expect(countColor(png, overWhite(m.color ?? MASK_COLOR, 0.28), FILL_TOLERANCE)).toBeGreaterThan(MIN_PIXELS);
      for (const _level of model.levels ?? []) expect(countColor(png, '#d62728', COLOR_TOLERANCE)).toBeGreaterThan(MIN_PIXELS);
      // orange (PLOT_PALETTE[4]) is used by none of these plots: the check must see nothing of it
      expect(countColor(png, PLOT_PALETTE[4], COLOR_TOLERANCE)).toBeLessThan(5);
    });
  });
});
