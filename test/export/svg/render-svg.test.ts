/**
 * SVG plots without a browser: escaping, ticks, determinism, the plot builders' content and typed
 * errors. The browser check is chromium-render.test.ts.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { escapeXml, px, renderPlotSvg } from '../../../src/export/svg/render-svg';
import { formatSi, linearTicks, logRange, logTicks, niceRange, niceStep, phaseStep } from '../../../src/export/svg/ticks';
import { gainPlot, groupDelayPlot, swingPlot } from '../../../src/export/svg/plots';
import type { PlotModel } from '../../../src/export/svg/plot-model';
import { expectInvalidInput } from '../helpers/expect-error';
import { FREQUENCY_HZ, GAIN_DB, samplePlots } from './sample-plots';

describe('text and numbers', () => {
  it('escapeXml leaves only safe ASCII and character references', () => {
    expect(escapeXml('a<b>&"c\' \u00b5 \u65e5 \u0007\n')).toBe('a&lt;b&gt;&amp;&quot;c&#39; &#181; &#26085; ? ');
    fc.assert(
      fc.property(fc.string({ unit: 'binary', maxLength: 80 }), (s) => {
        expect(escapeXml(s)).toMatch(/^([ !#-%(-;=?-~]|&(amp|lt|gt|quot|#[0-9]+);)*$/);
      }),
      { numRuns: 500 },
    );
  });

  it('pixel coordinates have two decimals and never -0.00', () => {
    expect(px(1 / 3)).toBe('0.33');
    expect(px(-0.001)).toBe('0.00');
    expect(px(12)).toBe('12.00');
  });
});

describe('ticks', () => {
  it('log axes: whole decades, labelled decades, minor ticks 2..9', () => {
    expect(logRange(13, 47000)).toEqual([10, 100000]);
    expect(logRange(100, 100)).toEqual([100, 1000]);
    const t = logTicks(10, 1000);
    expect(t.filter((x) => x.major).map((x) => x.label)).toEqual(['10', '100', '1k']);
    expect(t.filter((x) => !x.major).map((x) => x.value).slice(0, 8)).toEqual([20, 30, 40, 50, 60, 70, 80, 90]);
    expect(t.filter((x) => !x.major).every((x) => x.label === '')).toBe(true);
    // within one decade, 2 and 5 get labels too
    expect(logTicks(150, 900).filter((x) => x.label).map((x) => x.label)).toEqual(['200', '500']);
  });

  it('linear axes: 1-2-5 steps, exact values, at most about ten ticks', () => {
    expect(niceStep(101.5)).toBe(10);
    expect(niceStep(3)).toBe(0.5);
    expect(niceRange(-93.2, 1.4)).toEqual([-100, 10]);
    expect(linearTicks(0, 1).map((t) => t.label)).toEqual(['0.0', '0.1', '0.2', '0.3', '0.4', '0.5', '0.6', '0.7', '0.8', '0.9', '1.0']);
    expect(linearTicks(-0.3, 0.3).map((t) => t.value)).toEqual([-0.3, -0.2, -0.1, 0, 0.1, 0.2, 0.3]);
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.double({ min: 1e-6, max: 1e6, noNaN: true }), (lo, span) => {
        const [a, b] = niceRange(lo, lo + span);
        const n = linearTicks(a, b).length;
        expect(n).toBeGreaterThanOrEqual(2);
        expect(n).toBeLessThanOrEqual(25);
      }),
    );
  });

  it('phase steps are multiples of 45 degrees; SI labels', () => {
    expect(phaseStep(60)).toBeUndefined();
    expect(phaseStep(400)).toBe(45);
    expect(phaseStep(900)).toBe(90);
    expect(phaseStep(1000)).toBe(180);
    expect(['1', '1k', '2.2M', '500m', '10u'].map((s, i) => formatSi([1, 1000, 2.2e6, 0.5, 1e-5][i]) === s)).toEqual([true, true, true, true, true]);
  });
});

describe('renderPlotSvg', () => {
  it('is deterministic and holds title, labels, legend entries and one polyline per series', () => {
    for (const model of Object.values(samplePlots())) {
      const svg = renderPlotSvg(model);
      expect(renderPlotSvg(model)).toBe(svg);
      expect(svg.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
      for (const text of [model.title, model.xLabel, model.yLabel, ...model.series.map((s) => s.label)]) expect(svg).toContain(escapeXml(text));
      expect(svg.match(/<polyline /g)?.length).toBe(model.series.length);
    }
  });

  it('the gain plot carries mask regions, the envelope band and error bars for every test point', () => {
    const svg = renderPlotSvg(samplePlots().gain);
    expect(svg.match(/fill-opacity="0.28"/g)?.length).toBe(3 + 1); // three forbidden regions and the legend swatch
    expect(svg.match(/<polygon /g)?.length).toBe(1);
    expect(svg.match(/<circle /g)?.length).toBe(3 + 1);
    expect(svg).toContain('>Gain (dB)<');
    expect(svg).toContain('>Frequency (Hz)<');
    expect(svg).toContain('>10k<');
  });

  it('a NaN breaks a curve; +-Infinity is drawn just outside the plot, never as a huge number', () => {
    const y = GAIN_DB.slice();
    y[100] = NaN;
    y[200] = -Infinity;
    const svg = renderPlotSvg(gainPlot({ frequencyHz: FREQUENCY_HZ, gainDb: y }));
    expect(svg.match(/<polyline /g)?.length).toBe(2);
    for (const [, v] of svg.matchAll(/(-?[0-9]+\.[0-9]+)/g)) expect(Math.abs(Number(v))).toBeLessThan(2000);
  });

  it('group delay picks its time unit; swing shows the clipping level', () => {
    expect(groupDelayPlot({ frequencyHz: [1, 2], groupDelayS: [2e-4, 3e-4] }).yLabel).toBe('Group delay (\u00b5s)');
    expect(groupDelayPlot({ frequencyHz: [1, 2], groupDelayS: [0.2, 0.3] }).yLabel).toBe('Group delay (ms)');
    const s = swingPlot({ frequencyHz: [10, 100], outputs: [{ label: 'U1', peakV: [1, 2] }], clippingV: 3 });
    expect(s.levels?.[0].y).toBe(3);
    expect(renderPlotSvg(s)).toContain('Clipping 3 V');
  });

  it('a linear x axis, markers without error bars, long text cut to fit', () => {
    const svg = renderPlotSvg({
      title: 'T'.repeat(100),
      xLabel: 'Time (s)',
      yLabel: 'Output (V)',
      xScale: 'linear',
      series: [{ label: 'L'.repeat(40), x: [0, 0.5, 1], y: [0, 1, 0], style: { dash: 'dotted', widthPx: 1.5 } }],
      markers: [{ label: 'samples', points: [{ x: 0.25, y: 0.5 }] }],
    });
    expect(svg).toContain('>0.5<'); // linear x tick labels
    expect(svg.match(/<path /g)?.length).toBe(1); // no error bar without low/high: only the legend swatch
    expect(svg).toContain(`>${'T'.repeat(63)}&#8230;<`);
    expect(svg).toContain(`>${'L'.repeat(25)}&#8230;<`);
    expect(svg).toContain('stroke-dasharray="2 4"');
    expect(svg.match(/<circle /g)?.length).toBe(2); // the point and its legend swatch
  });

  it('bad input throws typed errors naming the field', () => {
    const base: PlotModel = { title: 't', xLabel: 'x', yLabel: 'y', series: [{ label: 'a', x: [1, 10], y: [0, 1] }] };
    expectInvalidInput(() => renderPlotSvg({ ...base, series: [{ label: 'a', x: [1, 10], y: [0, 1], style: { color: 'red" onload="x' } }] }), 'INVALID_ARGUMENT', 'plot.series[0].style.color');
    expectInvalidInput(() => renderPlotSvg({ ...base, xRange: [0, 10] }), 'OUT_OF_RANGE', 'plot.range');
    expectInvalidInput(() => renderPlotSvg({ ...base, yStep: 1e-9 }), 'OUT_OF_RANGE', 'plot.yStep');
    expectInvalidInput(() => renderPlotSvg({ ...base, widthPx: 100 }), 'OUT_OF_RANGE', 'plot.widthPx');
    expectInvalidInput(() => renderPlotSvg(null as never), 'INVALID_ARGUMENT', 'plot');
    expectInvalidInput(() => gainPlot({ frequencyHz: [1, 2], gainDb: [1] }), 'INVALID_ARGUMENT', 'gainDb');
    expectInvalidInput(() => gainPlot({ frequencyHz: [1], gainDb: [1], mask: [{ fromHz: 5, toHz: 1, maxDb: 0 }] }), 'OUT_OF_RANGE', 'mask[0].toHz');
    expectInvalidInput(() => swingPlot({ frequencyHz: [1], outputs: [], clippingV: 0 }), 'OUT_OF_RANGE', 'clippingV');
  });
});
