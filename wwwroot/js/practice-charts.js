// Charts a practitioner expects beside the tables: the time series at a point (Hs and J, zoomable, with the nearest
// buoy's record over it), and for a buoy's validation the model against the measurement (a 2-D histogram where pairs
// are many) with the 1:1 and fitted lines, and the quantile-quantile plot. Drawn by uPlot, like the other charts.

/* global uPlot */

import { el, number } from './format.js';
import { seriesColours } from './charts.js';
import { sequentialScale } from './colour-scale.js';

const axisStyle = { stroke: '#2b3742', grid: { stroke: '#e3e7ea', width: 1 }, ticks: { stroke: '#c7ced4', width: 1 } };
const buoyColour = '#1d1d1d';

/** Pairs above which the scatter is drawn as a 2-D histogram (points would hide each other). */
export const densityAbove = 2000;

function figure(caption, note, build, attributes = {}) {
  const target = el('div', { class: 'chart', role: 'img', 'aria-label': caption });
  const holder = el('figure', { class: 'chart-figure', ...attributes }, target, el('figcaption', {}, caption), note ? el('p', { class: 'chart-note' }, note) : null);
  holder.mount = () => {
    const width = Math.max(260, Math.min(560, ((holder.parentElement || holder).clientWidth || 400) - 4));
    holder.plot = build(target, width);
    return holder.plot;
  };
  return holder;
}

/**
 * Hs (left axis) and J (right axis) through time at the point, zoomed by dragging across the chart (a double click
 * shows the whole record again); the buoy's measured Hs over it when given ({ name, km, times, hs }).
 */
export function timeSeriesChart(steps, buoy) {
  const x = steps.map(s => Date.parse(s.time) / 1000);
  const hs = steps.map(s => s.hs), j = steps.map(s => s.j);
  const data = [x, hs, j];
  const series = [
    {},
    { label: 'Hs (m)', scale: 'hs', stroke: seriesColours.hs, width: 1, points: { show: false }, value: (u, v) => number(v) },
    { label: 'J (kW/m)', scale: 'j', stroke: seriesColours.j, width: 1, points: { show: false }, value: (u, v) => number(v) },
  ];
  if (buoy) {
    // The buoy's values on the point's time line: each step takes the measurement at that time, where there is one.
    const measured = new Map(buoy.times.map((t, k) => [t, buoy.hs[k]]));
    data.push(x.map(t => measured.get(t) ?? null));
    series.push({ label: `${buoy.name}: measured Hs (m)`, scale: 'hs', stroke: buoyColour, width: 0, spanGaps: false,
      points: { show: true, size: 2.5, fill: 'rgba(29, 29, 29, 0.35)', stroke: 'rgba(29, 29, 29, 0.35)' }, paths: () => null, value: (u, v) => number(v) });
  }
  const build = (target, width) => new uPlot({
    width, height: 220,
    legend: { show: true, live: true },
    cursor: { drag: { x: true, y: false, setScale: true } },
    scales: { x: { time: true }, hs: { range: (u, lo, hi) => [0, hi * 1.1 || 1] }, j: { range: (u, lo, hi) => [0, hi * 1.1 || 1] } },
    series,
    axes: [
      { ...axisStyle },
      { ...axisStyle, scale: 'hs', label: 'Hs (m)', size: 44 },
      { ...axisStyle, scale: 'j', side: 1, label: 'kW/m', grid: { show: false }, size: 48 },
    ],
  }, data, target);
  const note = `${steps.length.toLocaleString('en-GB')} steps. Drag across the chart to zoom in; double-click to see the whole record.` +
    (buoy ? ` Dots: the record of ${buoy.name}, ${number(buoy.km)} km away, at the steps it was matched to the hindcast.` : '');
  return figure('Hs and wave power J through time', note, build, { 'data-chart': 'time-series' });
}

/** The frame both validation charts share: square, both axes from 0 to top, zoom by dragging a box. */
function squareFrame(width, height, top) {
  return {
    width, height: Math.min(height, width),
    legend: { show: true, live: false },
    cursor: { drag: { x: true, y: true, setScale: true } },
    scales: { x: { time: false, range: [0, top] }, y: { range: [0, top] } },
  };
}

/** Counts of (measured, modelled) pairs in square bins of the plot's span: the 2-D histogram of a dense scatter. */
export function histogram2d(observed, modelled, top, bins) {
  const counts = new Array(bins * bins).fill(0);
  for (let k = 0; k < observed.length; k++) {
    const c = Math.min(bins - 1, Math.floor(observed[k] / top * bins));
    const r = Math.min(bins - 1, Math.floor(modelled[k] / top * bins));
    if (c >= 0 && r >= 0) counts[r * bins + c]++;
  }
  return counts;
}

/** Modelled against measured values with the 1:1 line and the fitted line (slope, intercept from the skill answer). */
export function scatterChart(pairs, fit, { label, unit }) {
  const observed = pairs.map(p => p.observed), modelled = pairs.map(p => p.modelled);
  const top = Math.max(...observed, ...modelled) * 1.05 || 1;
  const dense = pairs.length > densityAbove;
  const bins = 40;
  const counts = dense ? histogram2d(observed, modelled, top, bins) : null;
  const largest = dense ? Math.max(...counts) : 0;
  const drawDensity = u => {
    const ctx = u.ctx;
    const step = top / bins;
    ctx.save();
    for (let r = 0; r < bins; r++) for (let c = 0; c < bins; c++) {
      const n = counts[r * bins + c];
      if (!n) continue;
      // Coloured by the logarithm of the count: pairs crowd the calm end, and a linear scale would show only it.
      ctx.fillStyle = sequentialScale.css(Math.log(n) / Math.log(Math.max(2, largest)));
      const x0 = u.valToPos(c * step, 'x', true), x1 = u.valToPos((c + 1) * step, 'x', true);
      const y0 = u.valToPos((r + 1) * step, 'y', true), y1 = u.valToPos(r * step, 'y', true);
      ctx.fillRect(x0, y0, x1 - x0 + 0.5, y1 - y0 + 0.5);
    }
    ctx.restore();
  };
  // Points sorted by the measurement, as uPlot's x values must be; the lines as two-point series on the same axis.
  const order = observed.map((o, k) => k).sort((a, b) => observed[a] - observed[b]);
  const xs = order.map(k => observed[k]);
  const ys = order.map(k => modelled[k]);
  const lineAt = (slope, intercept) => xs.map((v, k) => (k === 0 || k === xs.length - 1) ? intercept + slope * v : null);
  const build = (target, width) => new uPlot({
    ...squareFrame(width, 320, top),
    series: [
      { label: `measured ${label} (${unit})` },
      { label: dense ? `pairs (${pairs.length.toLocaleString('en-GB')}, as a 2-D histogram)` : `pairs (${pairs.length.toLocaleString('en-GB')})`,
        stroke: seriesColours.j, fill: seriesColours.j, paths: () => null, points: { show: !dense, size: 3, fill: seriesColours.j + '88' } },
      { label: '1:1', stroke: buoyColour, dash: [6, 4], width: 1, spanGaps: true, points: { show: false } },
      fit ? { label: `fitted: ${number(fit.slope)} x + ${number(fit.intercept)}`, stroke: seriesColours.hs, width: 2, spanGaps: true, points: { show: false } } : { show: false },
    ],
    hooks: dense ? { drawClear: [drawDensity] } : {},
    axes: [
      { ...axisStyle, label: `measured ${label} (${unit})` },
      { ...axisStyle, label: `modelled ${label} (${unit})`, size: 44 },
    ],
  }, [xs, ys, lineAt(1, 0), fit ? lineAt(fit.slope, fit.intercept) : xs.map(() => null)], target);
  return figure(`${label}: model against measurement`, dense ? 'Colour: the logarithm of the number of pairs in each cell (house colour scale).' : null,
    build, { 'data-chart': 'validation-scatter' });
}

/** Quantiles of the model against those of the measurement (probabilities 0.01 to 0.99), with the 1:1 line. */
export function quantileChart(quantiles, { label, unit }) {
  const rows = quantiles.filter(q => q.observed != null && q.modelled != null);
  const xs = rows.map(q => q.observed), ys = rows.map(q => q.modelled);
  const top = Math.max(...xs, ...ys) * 1.05 || 1;
  const build = (target, width) => new uPlot({
    ...squareFrame(width, 300, top),
    series: [
      { label: `measured quantile (${unit})` },
      { label: 'quantile pairs', stroke: seriesColours.j, paths: () => null, points: { show: true, size: 4 } },
      { label: '1:1', stroke: buoyColour, dash: [6, 4], width: 1, spanGaps: true, points: { show: false } },
    ],
    axes: [
      { ...axisStyle, label: `measured ${label} quantile (${unit})` },
      { ...axisStyle, label: `modelled (${unit})`, size: 44 },
    ],
  }, [xs, ys, xs.map((v, k) => (k === 0 || k === xs.length - 1) ? v : null)], target);
  return figure(`${label}: quantile against quantile`, 'Probabilities 0.01 to 0.99; measured and modelled values sorted separately (linear interpolation).',
    build, { 'data-chart': 'validation-qq' });
}
