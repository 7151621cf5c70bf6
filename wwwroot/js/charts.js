// Small charts of the point panel, drawn by uPlot (canvas, no GPU needed). Each chart comes in a figure with a
// caption and a table of its values behind a disclosure, so the numbers are reachable without seeing the canvas.

/* global uPlot */

import { el, number, months } from './format.js';

export const seriesColours = { j: '#0b5f7a', hs: '#a8430a', te: '#5a3d8a' };

function chartWidth(container) {
  return Math.max(260, Math.min(560, (container.clientWidth || 400) - 4));
}

function valuesTable(headers, rows) {
  const table = el('table', { class: 'stats-table' },
    el('thead', {}, el('tr', {}, headers.map(h => el('th', { scope: 'col' }, h)))),
    el('tbody', {}, rows.map(r => el('tr', {}, r.map((v, i) => i === 0 ? el('th', { scope: 'row' }, v) : el('td', {}, v))))));
  return el('details', { class: 'chart-values' }, el('summary', {}, 'Values as a table'), table);
}

/** A figure holding a uPlot chart; the chart is created once the figure is in the document (it needs a width). */
function chartFigure(caption, build, table, note) {
  const target = el('div', { class: 'chart', role: 'img', 'aria-label': caption });
  const figure = el('figure', { class: 'chart-figure' }, target, el('figcaption', {}, caption),
    note ? el('p', { class: 'chart-note' }, note) : null, table);
  figure.mount = () => {
    const plot = build(target, chartWidth(figure.parentElement || figure));
    figure.plot = plot;
    return plot;
  };
  return figure;
}

const axisStyle = { stroke: '#2b3742', grid: { stroke: '#e3e7ea', width: 1 }, ticks: { stroke: '#c7ced4', width: 1 } };

/** Monthly means of J (bars, left axis) and Hs (line, right axis). */
export function monthlyMeansChart(periods) {
  const byName = Object.fromEntries(periods.map(p => [p.period, p]));
  const x = [], j = [], hs = [];
  months.forEach((m, k) => {
    x.push(k + 1);
    j.push(byName[m]?.j?.mean ?? null);
    hs.push(byName[m]?.hs?.mean ?? null);
  });
  const labels = months.map(m => m[0].toUpperCase() + m.slice(1));
  const build = (target, width) => new uPlot({
    width, height: 200,
    legend: { show: true, live: false },
    cursor: { drag: { x: false, y: false } },
    scales: { x: { time: false, range: [0.5, 12.5] }, j: { range: (u, lo, hi) => [0, hi * 1.08 || 1] }, hs: { range: (u, lo, hi) => [0, hi * 1.15 || 1] } },
    series: [
      { label: 'Month', value: (u, v) => v == null ? '–' : labels[v - 1] },
      { label: 'J mean (kW/m)', scale: 'j', stroke: seriesColours.j, fill: 'rgba(11, 95, 122, 0.55)', width: 1,
        paths: uPlot.paths.bars({ size: [0.65, 40] }), points: { show: false }, value: (u, v) => number(v) },
      { label: 'Hs mean (m)', scale: 'hs', stroke: seriesColours.hs, width: 2, points: { show: true, size: 5 }, value: (u, v) => number(v) },
    ],
    axes: [
      { ...axisStyle, splits: () => x, values: (u, vals) => vals.map(v => labels[v - 1]?.[0] ?? ''), grid: { show: false } },
      { ...axisStyle, scale: 'j', label: 'kW/m', size: 48 },
      { ...axisStyle, scale: 'hs', side: 1, label: 'm', grid: { show: false }, size: 40 },
    ],
  }, [x, j, hs], target);
  return chartFigure('Monthly means of wave power J and Hs', build,
    valuesTable(['Month', 'J mean (kW/m)', 'Hs mean (m)'], labels.map((l, k) => [l, number(j[k]), number(hs[k])])));
}

/** Share of time a parameter exceeds each threshold, in percent, cut where it falls below 0.1 %. */
export function exceedanceChart(curve, { label, units, colour }) {
  let end = curve.thresholds.length;
  while (end > 2 && curve.fractions[end - 1] < 0.001) end--;
  const x = curve.thresholds.slice(0, Math.min(curve.thresholds.length, end + 1));
  const y = curve.fractions.slice(0, x.length).map(f => 100 * f);
  const build = (target, width) => new uPlot({
    width, height: 170,
    legend: { show: false },
    cursor: { drag: { x: false, y: false } },
    scales: { x: { time: false }, y: { range: [0, 100] } },
    series: [
      { label: `${label} (${units})`, value: (u, v) => number(v) },
      { label: 'exceeded (% of time)', stroke: colour, width: 2, fill: colour + '22', points: { show: false }, value: (u, v) => v == null ? '–' : v.toFixed(1) },
    ],
    axes: [
      { ...axisStyle, label: `${label} (${units})` },
      { ...axisStyle, label: '% of time', size: 44 },
    ],
  }, [x, y], target);
  const picks = [0.9, 0.5, 0.1, 0.01].map(p => {
    const k = curve.fractions.findIndex(f => f <= p);
    return [`${(100 * p).toFixed(p < 0.1 ? 0 : 0)} % of time`, k < 0 ? '–' : `${number(curve.thresholds[k])} ${units}`];
  });
  return chartFigure(`Exceedance of ${label}: share of time above each value`, build,
    valuesTable(['Exceeded for', `${label} above about`], picks),
    `${curve.count.toLocaleString('en-GB')} steps; thresholds every ${number(curve.step)} ${units}; the tail below 0.1 % of time is not drawn.`);
}

/** Annual means per year: J bars and Hs line. */
export function interAnnualChart(series) {
  const years = series.years;
  const x = years.map(y => y.year);
  const j = years.map(y => y.j), hs = years.map(y => y.hs);
  const build = (target, width) => new uPlot({
    width, height: 180,
    legend: { show: true, live: false },
    cursor: { drag: { x: false, y: false } },
    scales: { x: { time: false, range: [x[0] - 0.6, x[x.length - 1] + 0.6] }, j: { range: (u, lo, hi) => [0, hi * 1.1 || 1] }, hs: { range: (u, lo, hi) => [0, hi * 1.2 || 1] } },
    series: [
      { label: 'Year', value: (u, v) => v == null ? '–' : String(v) },
      { label: 'J mean (kW/m)', scale: 'j', stroke: seriesColours.j, fill: 'rgba(11, 95, 122, 0.55)', width: 1,
        paths: uPlot.paths.bars({ size: [0.55, 50] }), points: { show: false }, value: (u, v) => number(v) },
      { label: 'Hs mean (m)', scale: 'hs', stroke: seriesColours.hs, width: 2, points: { show: true, size: 5 }, value: (u, v) => number(v) },
    ],
    axes: [
      { ...axisStyle, splits: () => x, values: (u, vals) => vals.map(v => String(v)), grid: { show: false } },
      { ...axisStyle, scale: 'j', label: 'kW/m', size: 48 },
      { ...axisStyle, scale: 'hs', side: 1, label: 'm', grid: { show: false }, size: 40 },
    ],
  }, [x, j, hs], target);
  return chartFigure('Year-to-year variation of the annual means', build,
    valuesTable(['Year', 'J mean (kW/m)', 'Hs mean (m)', 'Coverage'],
      years.map(y => [String(y.year), number(y.j), number(y.hs), `${(100 * y.coverage).toFixed(0)} %${y.low_coverage ? ' (low)' : ''}`])));
}
