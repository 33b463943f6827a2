/**
 * SVG rendering of a {@link PlotModel}, without a browser: a string of SVG 1.1 that any viewer opens.
 *
 * Layout: the title on top, the plot area with a grid (decades and their 2..9 minor lines on a log
 * axis, 1-2-5 steps on a linear one), axis labels with units, and the legend to the right of the plot
 * area so it never covers a curve. Draw order: masks (translucent grey), bands (translucent), grid,
 * series, levels, markers with error bars; everything inside the plot area is clipped to it.
 *
 * Deterministic: every coordinate is printed with two decimals (0.01 px is far below a screen pixel),
 * elements come in model order, and ids are fixed. Safe: text is XML-escaped with every non-ASCII
 * character as a numeric character reference and characters XML 1.0 forbids replaced by '?'; colours
 * must be #rrggbb (InvalidInputError otherwise), so no user text reaches an attribute unescaped.
 */
import { InvalidInputError } from '../../errors';
import { BAND_COLOR, MASK_COLOR, PLOT_PALETTE, type PlotModel, type PlotStyle } from './plot-model';
import { linearTicks, logRange, logTicks, niceRange, type AxisTick } from './ticks';

const DEFAULT_WIDTH_PX = 900;
const DEFAULT_HEIGHT_PX = 560;
/** Room for the y tick labels and the rotated y label. */
const MARGIN_LEFT_PX = 80;
/** Room for the legend. */
const MARGIN_RIGHT_PX = 220;
const MARGIN_TOP_PX = 48;
const MARGIN_BOTTOM_PX = 64;
/** Points beyond the plot are drawn this far outside it at most (then clipped): no huge coordinates. */
const OVERSHOOT_PX = 40;
const MASK_OPACITY = 0.28;
const BAND_OPACITY = 0.35;
const FONT = 'font-family="DejaVu Sans, Arial, Helvetica, sans-serif"';
const COLOR_PATTERN = /^#[0-9a-fA-F]{6}$/;
/** More y ticks than this is a mistake in yStep (and a huge SVG). */
const MAX_TICKS = 200;

/** Text safe inside an XML element or a double-quoted attribute (see the module comment). */
export function escapeXml(text: string): string {
  let out = '';
  for (const ch of String(text)) {
    const code = ch.codePointAt(0) ?? 0;
    if (ch === '&') out += '&amp;';
    else if (ch === '<') out += '&lt;';
    else if (ch === '>') out += '&gt;';
    else if (ch === '"') out += '&quot;';
    else if (ch === "'") out += '&#39;';
    else if (code === 0x09 || code === 0x0a || code === 0x0d) out += ' ';
    else if (code < 0x20 || (code >= 0xd800 && code <= 0xdfff) || code === 0xfffe || code === 0xffff) out += '?';
    else if (code >= 0x7f) out += `&#${code};`;
    else out += ch;
  }
  return out;
}

/** A pixel coordinate with two decimals, never '-0.00'. */
export function px(v: number): string {
  const s = v.toFixed(2);
  return s === '-0.00' ? '0.00' : s;
}

/**
 * The SVG text of the plot (see the module comment).
 *
 * @example
 * const svg = renderPlotSvg(gainPlot({ frequencyHz: [10, 100, 1000], gainDb: [0, -3, -20] }));
 * svg.includes('>Gain (dB)<'); // true
 */
export function renderPlotSvg(model: PlotModel): string {
  if (typeof model !== 'object' || model === null || !Array.isArray(model.series)) {
    throw new InvalidInputError('INVALID_ARGUMENT', 'plot', model, 'must be a PlotModel with a series array');
  }
  const width = model.widthPx ?? DEFAULT_WIDTH_PX;
  const height = model.heightPx ?? DEFAULT_HEIGHT_PX;
  const logX = (model.xScale ?? 'log') === 'log';
  const left = MARGIN_LEFT_PX;
  const top = MARGIN_TOP_PX;
  const plotW = width - MARGIN_LEFT_PX - MARGIN_RIGHT_PX;
  const plotH = height - MARGIN_TOP_PX - MARGIN_BOTTOM_PX;
  if (!(plotW > 50 && plotH > 50)) throw new InvalidInputError('OUT_OF_RANGE', 'plot.widthPx', [width, height], 'leaves no room for the plot');

  const [xMin, xMax] = model.xRange ?? autoXRange(model, logX);
  const [yMin, yMax] = model.yRange ?? autoYRange(model, model.yStep);
  if (!(xMax > xMin) || (logX && !(xMin > 0)) || !(yMax > yMin)) {
    throw new InvalidInputError('OUT_OF_RANGE', 'plot.range', { x: [xMin, xMax], y: [yMin, yMax] }, 'needs max > min (and x > 0 on a log axis)');
  }
  const fx = logX
    ? (x: number) => left + ((Math.log10(x) - Math.log10(xMin)) / (Math.log10(xMax) - Math.log10(xMin))) * plotW
    : (x: number) => left + ((x - xMin) / (xMax - xMin)) * plotW;
  const fy = (y: number) => top + ((yMax - y) / (yMax - yMin)) * plotH;
  const clampX = (v: number) => Math.min(left + plotW + OVERSHOOT_PX, Math.max(left - OVERSHOOT_PX, v));
  const clampY = (v: number) => Math.min(top + plotH + OVERSHOOT_PX, Math.max(top - OVERSHOOT_PX, v));
  const X = (x: number) => clampX(x === Infinity ? Infinity : x === -Infinity || (logX && x <= 0) ? -Infinity : fx(x));
  const Y = (y: number) => clampY(y === Infinity ? -Infinity : y === -Infinity ? Infinity : fy(y));

  const out: string[] = [];
  out.push(
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" ${FONT} font-size="13">`,
    `<title>${escapeXml(model.title)}</title>`,
    `<rect x="0" y="0" width="${width}" height="${height}" fill="#ffffff"/>`,
    `<defs><clipPath id="plot-area"><rect x="${px(left)}" y="${px(top)}" width="${px(plotW)}" height="${px(plotH)}"/></clipPath></defs>`,
    `<text x="${px(left + plotW / 2)}" y="${px(top - 18)}" text-anchor="middle" font-size="17" font-weight="bold">${escapeXml(shorten(model.title, MAX_TITLE_CHARS))}</text>`,
  );

  // grid and tick labels
  const xTicks: AxisTick[] = logX ? logTicks(xMin, xMax) : linearTicks(xMin, xMax);
  const yStep = model.yStep;
  if (yStep !== undefined && !(yStep > 0 && (yMax - yMin) / yStep <= MAX_TICKS)) {
    throw new InvalidInputError('OUT_OF_RANGE', 'plot.yStep', yStep, `must be positive with at most ${MAX_TICKS} ticks`);
  }
  const yTicks = linearTicks(yMin, yMax, yStep);
  out.push('<g stroke-width="1" fill="none">');
  for (const t of xTicks) {
    const x = px(fx(t.value));
    out.push(`<line x1="${x}" y1="${px(top)}" x2="${x}" y2="${px(top + plotH)}" stroke="${t.major ? '#c8c8c8' : '#ececec'}"/>`);
  }
  for (const t of yTicks) {
    const y = px(fy(t.value));
    out.push(`<line x1="${px(left)}" y1="${y}" x2="${px(left + plotW)}" y2="${y}" stroke="#d8d8d8"/>`);
  }
  out.push('</g>');

  out.push('<g clip-path="url(#plot-area)">');
  // masks, then bands (under the curves)
  (model.masks ?? []).forEach((m, i) => {
    const color = colorOf(m.color ?? MASK_COLOR, `plot.masks[${i}].color`);
    for (const r of m.regions) {
      const x0 = X(Math.min(r.x0, r.x1));
      const x1 = X(Math.max(r.x0, r.x1));
      const y0 = Y(Math.max(r.y0, r.y1));
      const y1 = Y(Math.min(r.y0, r.y1));
      if ([x0, x1, y0, y1].some(Number.isNaN)) continue;
      out.push(`<rect x="${px(x0)}" y="${px(y0)}" width="${px(x1 - x0)}" height="${px(y1 - y0)}" fill="${color}" fill-opacity="${MASK_OPACITY}" stroke="${color}" stroke-width="1"/>`);
    }
  });
  (model.bands ?? []).forEach((b, i) => {
    const color = colorOf(b.color ?? BAND_COLOR, `plot.bands[${i}].color`);
    for (const run of finiteRuns(b.x.length, (k) => [b.x[k], b.lower[k], b.upper[k]])) {
      const upper = run.map((k) => `${px(X(b.x[k]))},${px(Y(b.upper[k]))}`);
      const lower = run.reverse().map((k) => `${px(X(b.x[k]))},${px(Y(b.lower[k]))}`);
      out.push(`<polygon points="${[...upper, ...lower].join(' ')}" fill="${color}" fill-opacity="${BAND_OPACITY}" stroke="none"/>`);
    }
  });
  // series
  model.series.forEach((s, i) => {
    const style = strokeOf(s.style, PLOT_PALETTE[i % PLOT_PALETTE.length], `plot.series[${i}].style.color`);
    for (const run of finiteRuns(s.x.length, (k) => [s.x[k], Number.isNaN(s.y[k]) ? NaN : 0])) {
      if (run.length < 2) continue;
      const points = run.map((k) => `${px(X(s.x[k]))},${px(Y(s.y[k]))}`).join(' ');
      out.push(`<polyline points="${points}" fill="none" ${style} stroke-linejoin="round"/>`);
    }
  });
  // levels
  (model.levels ?? []).forEach((l, i) => {
    const style = strokeOf(l.style ?? { dash: 'dashed' }, '#d62728', `plot.levels[${i}].style.color`);
    if (Number.isFinite(l.y)) out.push(`<line x1="${px(left)}" y1="${px(Y(l.y))}" x2="${px(left + plotW)}" y2="${px(Y(l.y))}" ${style}/>`);
  });
  // markers with error bars
  (model.markers ?? []).forEach((m, i) => {
    const color = colorOf(m.color ?? '#000000', `plot.markers[${i}].color`);
    for (const p of m.points) {
      if (!Number.isFinite(p.x)) continue;
      const x = X(p.x);
      if (p.low !== undefined && p.high !== undefined && !Number.isNaN(p.low) && !Number.isNaN(p.high)) {
        const y0 = Y(p.high);
        const y1 = Y(p.low);
        out.push(
          `<path d="M${px(x - 5)},${px(y0)}H${px(x + 5)}M${px(x)},${px(y0)}V${px(y1)}M${px(x - 5)},${px(y1)}H${px(x + 5)}" stroke="${color}" stroke-width="2" fill="none"/>`,
        );
      }
      if (Number.isFinite(p.y)) out.push(`<circle cx="${px(x)}" cy="${px(Y(p.y))}" r="4" fill="${color}" stroke="#ffffff" stroke-width="1"/>`);
    }
  });
  out.push('</g>');

  // frame, ticks and labels
  out.push(`<rect x="${px(left)}" y="${px(top)}" width="${px(plotW)}" height="${px(plotH)}" fill="none" stroke="#333333" stroke-width="1"/>`);
  out.push('<g stroke="#333333" stroke-width="1">');
  for (const t of xTicks) {
    const x = px(fx(t.value));
    out.push(`<line x1="${x}" y1="${px(top + plotH)}" x2="${x}" y2="${px(top + plotH + (t.major ? 7 : 4))}"/>`);
  }
  for (const t of yTicks) out.push(`<line x1="${px(left - 6)}" y1="${px(fy(t.value))}" x2="${px(left)}" y2="${px(fy(t.value))}"/>`);
  out.push('</g>', '<g fill="#222222">');
  for (const t of xTicks) {
    if (t.label) out.push(`<text x="${px(fx(t.value))}" y="${px(top + plotH + 22)}" text-anchor="middle">${escapeXml(t.label)}</text>`);
  }
  for (const t of yTicks) out.push(`<text x="${px(left - 10)}" y="${px(fy(t.value) + 4)}" text-anchor="end">${escapeXml(t.label)}</text>`);
  out.push(
    `<text x="${px(left + plotW / 2)}" y="${px(height - 18)}" text-anchor="middle" font-size="14">${escapeXml(model.xLabel)}</text>`,
    `<text x="${px(18)}" y="${px(top + plotH / 2)}" text-anchor="middle" font-size="14" transform="rotate(-90 ${px(18)} ${px(top + plotH / 2)})">${escapeXml(model.yLabel)}</text>`,
    '</g>',
  );
  out.push(...legend(model, left + plotW + 16, top + 4));
  out.push('</svg>', '');
  return out.join('\n');
}

/** Legend rows in draw order: series, levels, markers, bands, masks. */
function legend(model: PlotModel, x0: number, y0: number): string[] {
  const rows: string[] = [];
  let y = y0 + 10;
  const label = (text: string) => `<text x="${px(x0 + 34)}" y="${px(y + 4)}" fill="#222222">${escapeXml(shorten(text))}</text>`;
  model.series.forEach((s, i) => {
    rows.push(`<line x1="${px(x0)}" y1="${px(y)}" x2="${px(x0 + 26)}" y2="${px(y)}" ${strokeOf(s.style, PLOT_PALETTE[i % PLOT_PALETTE.length], 'legend')}/>`, label(s.label));
    y += 22;
  });
  for (const l of model.levels ?? []) {
    rows.push(`<line x1="${px(x0)}" y1="${px(y)}" x2="${px(x0 + 26)}" y2="${px(y)}" ${strokeOf(l.style ?? { dash: 'dashed' }, '#d62728', 'legend')}/>`, label(l.label));
    y += 22;
  }
  for (const m of model.markers ?? []) {
    const c = colorOf(m.color ?? '#000000', 'legend');
    rows.push(`<path d="M${px(x0 + 8)},${px(y - 7)}H${px(x0 + 18)}M${px(x0 + 13)},${px(y - 7)}V${px(y + 7)}M${px(x0 + 8)},${px(y + 7)}H${px(x0 + 18)}" stroke="${c}" stroke-width="2" fill="none"/>`);
    rows.push(`<circle cx="${px(x0 + 13)}" cy="${px(y)}" r="4" fill="${c}" stroke="#ffffff" stroke-width="1"/>`, label(m.label));
    y += 22;
  }
  for (const b of model.bands ?? []) {
    rows.push(`<rect x="${px(x0)}" y="${px(y - 7)}" width="26" height="14" fill="${colorOf(b.color ?? BAND_COLOR, 'legend')}" fill-opacity="${BAND_OPACITY}"/>`, label(b.label));
    y += 22;
  }
  for (const m of model.masks ?? []) {
    const c = colorOf(m.color ?? MASK_COLOR, 'legend');
    rows.push(`<rect x="${px(x0)}" y="${px(y - 7)}" width="26" height="14" fill="${c}" fill-opacity="${MASK_OPACITY}" stroke="${c}"/>`, label(m.label));
    y += 22;
  }
  return ['<g font-size="12">', ...rows, '</g>'];
}

/** Legend labels are cut so they stay inside the legend column. */
const MAX_LEGEND_CHARS = 26;
/** Titles are cut so they stay above the plot area (17 px bold, about 9 px a character). */
const MAX_TITLE_CHARS = 64;
function shorten(text: string, max = MAX_LEGEND_CHARS): string {
  const chars = [...String(text)];
  return chars.length > max ? `${chars.slice(0, max - 1).join('')}\u2026` : chars.join('');
}

function colorOf(color: string, path: string): string {
  if (typeof color !== 'string' || !COLOR_PATTERN.test(color)) throw new InvalidInputError('INVALID_ARGUMENT', path, color, 'must be a colour #rrggbb');
  return color.toLowerCase();
}

const DASHES: Record<NonNullable<PlotStyle['dash']>, string> = { solid: '', dashed: ' stroke-dasharray="8 5"', dotted: ' stroke-dasharray="2 4"' };

function strokeOf(style: PlotStyle | undefined, fallback: string, path: string): string {
  const color = colorOf(style?.color ?? fallback, path);
  const width = style?.widthPx ?? 2;
  if (!(width > 0 && width <= 20)) throw new InvalidInputError('OUT_OF_RANGE', path.replace(/color$/, 'widthPx'), width, 'must be in (0, 20] px');
  const dash = DASHES[style?.dash ?? 'solid'];
  if (dash === undefined) throw new InvalidInputError('INVALID_ARGUMENT', path.replace(/color$/, 'dash'), style?.dash, "must be 'solid', 'dashed' or 'dotted'");
  return `stroke="${color}" stroke-width="${px(width)}"${dash}`;
}

/** Index runs where every value `get(k)` returns is not NaN (a NaN breaks the curve). */
function finiteRuns(n: number, get: (k: number) => number[]): number[][] {
  const runs: number[][] = [];
  let run: number[] = [];
  for (let k = 0; k < n; k++) {
    if (get(k).some((v) => typeof v !== 'number' || Number.isNaN(v))) {
      if (run.length) runs.push(run);
      run = [];
    } else run.push(k);
  }
  if (run.length) runs.push(run);
  return runs;
}

function finiteValues(model: PlotModel, axis: 'x' | 'y'): number[] {
  const out: number[] = [];
  const add = (v: number) => {
    if (Number.isFinite(v)) out.push(v);
  };
  for (const s of model.series) for (let k = 0; k < s.x.length; k++) add(axis === 'x' ? s.x[k] : s.y[k]);
  for (const b of model.bands ?? []) for (let k = 0; k < b.x.length; k++) (axis === 'x' ? [b.x[k]] : [b.lower[k], b.upper[k]]).forEach(add);
  for (const m of model.markers ?? []) for (const p of m.points) (axis === 'x' ? [p.x] : [p.y, p.low ?? NaN, p.high ?? NaN]).forEach(add);
  for (const m of model.masks ?? []) for (const r of m.regions) (axis === 'x' ? [r.x0, r.x1] : [r.y0, r.y1]).forEach(add);
  if (axis === 'y') for (const l of model.levels ?? []) add(l.y);
  return out;
}

function autoXRange(model: PlotModel, logX: boolean): [number, number] {
  const xs = finiteValues(model, 'x').filter((x) => !logX || x > 0);
  if (xs.length === 0) return logX ? [1, 10] : [0, 1];
  const [min, max] = extent(xs);
  return logX ? logRange(min, max) : niceRange(min, max);
}

function autoYRange(model: PlotModel, step?: number): [number, number] {
  const ys = finiteValues(model, 'y');
  if (ys.length === 0) return [0, 1];
  const [min, max] = extent(ys);
  return niceRange(min, max, step);
}

/** [min, max] by a loop (a spread of 100k points would overflow the call stack). */
function extent(values: readonly number[]): [number, number] {
  let min = Infinity;
  let max = -Infinity;
  for (const v of values) {
    if (v < min) min = v;
    if (v > max) max = v;
  }
  return [min, max];
}
