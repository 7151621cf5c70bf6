// Output points of a spectral hindcast on the page: markers for the points (a dataset of points, or the points loaded
// beside a gridded dataset), and the point panel's section of exact values from the spectra: spectral and parametric
// mean power side by side, the directionality from the period-mean resolved power, the mean spectrum and the power
// by direction.

/* global L, uPlot */

import { el, fixed, number, periodName } from './format.js';
import { powerRoseSvg } from './power-rose.js';

const markerStyle = { radius: 6, color: '#16202a', weight: 2, fillColor: '#f4f1e8', fillOpacity: 1 };

/** Draws the output points listed in a dataset description; a click opens the point panel there. */
export function drawOutputPoints(atlas, detail) {
  const points = detail.output_points ?? [];
  if (!points.length) return null;
  const group = L.layerGroup().addTo(atlas.map);
  for (const p of points) {
    const marker = L.circleMarker([p.lat, p.lon], { ...markerStyle, className: 'output-point', keyboard: true })
      .bindTooltip(`${p.name} — output point${p.depth_m == null ? '' : `, ${fixed(p.depth_m, 1)} m`} (exact spectral values)`)
      .on('click', e => { L.DomEvent.stopPropagation(e); atlas.point.open(p.lat, p.lon); });
    marker.addTo(group);
  }
  return group;
}

/** The panel's elements for a point answer's `spectral` block, and the charts to mount once they are in the page. */
export function spectralSection(point) {
  const s = point.spectral;
  if (!s) return { sections: [], figures: [] };
  const where = s.distance_km == null
    ? `At output point ${s.station}${s.depth_m == null ? '' : ` (${fixed(s.depth_m, 1)} m deep)`}: values integrated from its spectra.`
    : `Exact spectral values at the nearest output point, ${s.station}, ${number(s.distance_km)} km away` +
      `${s.depth_m == null ? '' : ` (${fixed(s.depth_m, 1)} m deep)`}.`;
  const select = el('select', { id: 'spectral-period' }, s.periods.map(p => el('option', { value: p.period }, periodName(p.period))));
  select.value = s.periods.some(p => p.period === 'annual') ? 'annual' : s.periods[0]?.period ?? '';
  const table = el('div');
  const spectrumHolder = el('div');
  const roseHolder = el('div', { id: 'spectral-rose' });
  const figures = [];
  const draw = () => {
    const period = s.periods.find(p => p.period === select.value);
    table.replaceChildren(periodTable(period));
    const figure = spectrumChart(s.frequencies_hz, period);
    spectrumHolder.replaceChildren(figure);
    roseHolder.replaceChildren(directionRose(s.directions_from_deg, period));
    if (figure.isConnected) figure.mount();
    else figures.push(figure);
  };
  select.addEventListener('change', draw);
  draw();
  return {
    sections: [
      el('h3', { id: 'spectral-heading' }, 'From the spectra'),
      el('p', { 'data-field': 'spectral-where' }, where),
      el('label', { class: 'inline' }, 'Period ', select),
      table,
      el('h4', {}, 'Mean frequency spectrum'),
      spectrumHolder,
      el('h4', {}, 'Mean power by direction'),
      el('p', { class: 'muted' }, 'Share of the period-mean power by the direction the waves come from (degrees true), from the spectra’s direction bins.'),
      roseHolder,
      el('p', { class: 'muted' }, s.method),
    ],
    figures,
  };
}

function periodTable(period) {
  if (!period) return el('p', { class: 'muted' }, 'No steps in this period.');
  const rows = [
    ['Mean J from the spectra (kW/m)', number(period.mean_power_spectral), 'spectral-power'],
    ['Mean J from Hm0 and Te (kW/m)', number(period.mean_power_parametric), 'parametric-power'],
    ['Parametric over spectral', fixed(period.parametric_over_spectral, 3), 'power-ratio'],
    ['Directionality d (1)', number(period.directionality_coefficient), 'spectral-d'],
    ['Largest resolved power from (°)', fixed(period.max_power_from_deg, 0), 'max-power-from'],
    ['Mean spectral width ε0 (1)', number(period.mean_spectral_width), 'spectral-width'],
  ];
  return el('div', { class: 'table-scroll' }, el('table', { class: 'stats-table', id: 'spectral-stats' },
    el('caption', {}, `${periodName(period.period)}: ${period.steps.toLocaleString('en-GB')} steps`),
    el('tbody', {}, rows.map(([label, value, field]) => el('tr', {}, el('th', { scope: 'row' }, label), el('td', { 'data-field': field }, value))))));
}

function spectrumChart(frequencies, period) {
  const values = period?.frequency_spectrum ?? [];
  const caption = 'Period-mean variance density S(f), m²/Hz, against frequency (Hz)';
  const target = el('div', { class: 'chart', role: 'img', 'aria-label': caption });
  const rows = frequencies.map((f, k) => el('tr', {}, el('th', { scope: 'row' }, fixed(f, 4)), el('td', {}, number(values[k]))));
  const figure = el('figure', { class: 'chart-figure' }, target, el('figcaption', {}, caption),
    el('details', { class: 'chart-values' }, el('summary', {}, 'Values as a table'),
      el('table', { class: 'stats-table' }, el('thead', {}, el('tr', {}, el('th', {}, 'f (Hz)'), el('th', {}, 'S(f) (m²/Hz)'))), el('tbody', {}, rows))));
  figure.mount = () => {
    const width = Math.max(260, Math.min(560, (figure.parentElement?.clientWidth || 400) - 4));
    figure.plot = new uPlot({
      width, height: 200,
      scales: { x: { time: false } },
      axes: [{ label: 'f (Hz)' }, { label: 'S(f) (m²/Hz)' }],
      series: [{}, { label: 'S(f)', stroke: '#0b5f7a', width: 2, points: { show: false } }],
      legend: { show: false },
    }, [frequencies, values.map(v => v ?? null)], target);
    return figure.plot;
  };
  return figure;
}

function directionRose(directions, period) {
  const powers = period?.direction_power ?? [];
  const total = powers.reduce((a, b) => a + (b ?? 0), 0);
  if (!directions.length || !(total > 0)) return el('p', { class: 'muted' }, 'No direction bins: the output point gives frequency spectra only.');
  return powerRoseSvg({
    sectors: directions.length,
    sector_width_degrees: 360 / directions.length,
    sector_centres_degrees: directions,
    fractions: powers.map(p => (p ?? 0) / total),
  }, '#0b5f7a');
}
