// Validation, device yield, weather windows and extremes at a point, shown when this server offers them. They are
// looked up in its OpenAPI document first, so a server without them is never asked (and the console stays clean).

import { apiRoot, datasetUrl, getJson, query } from './api.js';
import { el, fixed, number, percent, months } from './format.js';
import { quantileChart, scatterChart, timeSeriesChart } from './practice-charts.js';

const monthNames = months.map(m => m[0].toUpperCase() + m.slice(1));
const cache = new Map();

/** A GET cached for the page's lifetime (station and device lists change rarely). */
function cachedJson(url) {
  if (!cache.has(url)) cache.set(url, getJson(url).catch(error => { cache.delete(url); throw error; }));
  return cache.get(url);
}

/** Great-circle distance, km (spherical Earth of radius 6371.0088 km, the IUGG mean radius). */
export function distanceKm(lat1, lon1, lat2, lon2) {
  const r = Math.PI / 180;
  const a = Math.sin((lat2 - lat1) * r / 2) ** 2 + Math.cos(lat1 * r) * Math.cos(lat2 * r) * Math.sin((lon2 - lon1) * r / 2) ** 2;
  return 2 * 6371.0088 * Math.asin(Math.min(1, Math.sqrt(a)));
}

function section(id, title, ...children) {
  return el('section', { class: 'assessment', id, 'aria-labelledby': `${id}-title` }, el('h3', { id: `${id}-title` }, title), ...children);
}

function problemBox(error) {
  return el('div', { class: 'error-box' }, error.message);
}

function jsonLink(url, label = 'as JSON') {
  return el('a', { class: 'button-link', href: url }, label);
}

function table(caption, headers, rows, attributes = {}) {
  return el('div', { class: 'table-scroll' }, el('table', { class: 'stats-table', ...attributes },
    caption ? el('caption', {}, caption) : null,
    el('thead', {}, el('tr', {}, headers.map(h => el('th', { scope: 'col' }, h)))),
    el('tbody', {}, rows.map(r => el('tr', r.attributes ?? {}, r.cells.map((v, i) => i === 0 ? el('th', { scope: 'row' }, v) : el('td', {}, v)))))));
}

/** The registered station nearest the point's cell ({ s, km }), or null when none is registered. */
async function nearestStation(point) {
  const stations = (await cachedJson(`${apiRoot}/stations`)).stations ?? [];
  if (!stations.length) return null;
  const cell = point.cell;
  return stations.map(s => ({ s, km: distanceKm(cell.lat, cell.lon, s.lat, s.lon) })).sort((a, b) => a.km - b.km)[0];
}

const symbols = { hs: 'Hs', tp: 'Tp', te: 'Te' };

/** Skill of one variable by season and by class of the measured Hs, as the validation answer gives it. */
function groupedSkillTable(variable) {
  const rows = [...(variable.by_season ?? []), ...(variable.by_hs_class ?? [])].filter(g => g.skill?.n > 0).map(g => ({
    attributes: { 'data-group': g.season ?? `hs-${g.hs_lower_m}` },
    cells: [g.season ? g.season.toUpperCase() : (g.hs_upper_m == null ? `Hs ≥ ${number(g.hs_lower_m)} m` : `Hs ${number(g.hs_lower_m)}–${number(g.hs_upper_m)} m`),
      String(g.skill.n), number(g.skill.bias), number(g.skill.rmse), number(g.skill.scatter_index), number(g.skill.pearson_r)],
  }));
  return table(`${symbols[variable.variable] ?? variable.variable} by season and by class of the measured Hs (${variable.unit}).`,
    ['', 'N', 'bias', 'RMSE', 'scatter index', 'r'], rows, { id: `validation-groups-${variable.variable}` });
}

/** The nearest buoy's measured Hs at the pairs' times, or null (no station, or the dataset does not cover it). */
async function buoyRecord(atlas, point) {
  const nearest = await nearestStation(point);
  if (!nearest) return null;
  try {
    const plot = await cachedJson(`${datasetUrl(atlas.slug)}/validation/${encodeURIComponent(nearest.s.slug)}/pairs` + query({ variable: 'hs' }));
    return { name: nearest.s.name, km: nearest.km, plot };
  } catch {
    return null;
  }
}

async function seriesSection(atlas, point, at) {
  const holder = section('time-series', 'Time series');
  try {
    const [answer, buoy] = await Promise.all([getJson(`${datasetUrl(atlas.slug)}/point/series` + query({ ...at, format: 'json' })), buoyRecord(atlas, point)]);
    const steps = answer.steps ?? [];
    if (steps.length < 2) {
      holder.append(el('p', { class: 'muted' }, 'Too few stored steps for a time series.'));
      return holder;
    }
    let overlay = null;
    if (buoy) {
      // Each measurement on the nearest model step (within half a step): the chart has one time axis.
      const x0 = Date.parse(steps[0].time) / 1000, dt = Date.parse(steps[1].time) / 1000 - x0;
      const times = [], hs = [];
      for (const p of buoy.plot.pairs) {
        const t = Date.parse(p.time) / 1000;
        const k = Math.round((t - x0) / dt);
        if (k >= 0 && k < steps.length && Math.abs(t - (x0 + k * dt)) <= dt / 2) { times.push(x0 + k * dt); hs.push(p.observed); }
      }
      if (times.length) overlay = { name: buoy.name, km: buoy.km, times, hs };
    }
    holder.append(timeSeriesChart(steps, overlay));
  } catch (error) {
    holder.append(problemBox(error));
  }
  return holder;
}

async function validationSection(atlas, point, at) {
  const nearest = await nearestStation(point);
  if (!nearest) return null;
  const url = `${datasetUrl(atlas.slug)}/validation` + query({ station: nearest.s.slug });
  const holder = section('validation', 'Validation at the nearest buoy');
  try {
    const answer = await getJson(url);
    const skill = answer.stations?.[0];
    if (!skill) {
      const reason = answer.not_covered?.[0]?.reason ?? 'the dataset does not cover this station';
      holder.append(el('p', { class: 'muted' }, `${nearest.s.name}: ${reason}.`));
      return holder;
    }
    const scalar = skill.variables.filter(v => v.overall);
    const direction = skill.variables.find(v => v.directional);
    holder.append(
      el('p', { 'data-field': 'station' },
        `${skill.station.name}, ${number(nearest.km)} km from this cell (${skill.station.independent ? 'independent: not used to tune the hindcast' : 'used to calibrate the hindcast'}); ` +
        `compared with cell ${skill.cell.id}, ${number(skill.cell.distance_m / 1000)} km from the buoy.`),
      table('Hindcast against the buoy record (bias = model − observed; scatter index = RMSE / mean observed).',
        ['', 'N', 'bias', 'RMSE', 'scatter index', 'r'],
        scalar.map(v => ({
          attributes: { 'data-variable': v.variable },
          cells: [`${v.variable === 'hs' ? 'Hs' : v.variable === 'tp' ? 'Tp' : v.variable === 'te' ? 'Te' : v.variable} (${v.unit})`,
            String(v.overall.n), number(v.overall.bias), number(v.overall.rmse), number(v.overall.scatter_index), number(v.overall.pearson_r)],
        })), { id: 'validation-table' }),
      direction?.directional ? el('p', { class: 'muted' },
        `Direction: circular bias ${fixed(direction.directional.circular_bias, 1)}°, circular RMSE ${fixed(direction.directional.circular_rmse, 1)}° over ${direction.directional.n} pairs.`) : null,
      ...scalar.filter(v => v.variable === 'hs').map(groupedSkillTable),
      el('div', { class: 'links' }, jsonLink(url), jsonLink(url + '&format=csv', 'as CSV')));
    const hs = scalar.find(v => v.variable === 'hs');
    const record = hs ? await buoyRecord(atlas, point) : null;
    if (record && record.plot.pairs.length > 1) {
      const fit = hs.overall.regression_slope != null ? { slope: hs.overall.regression_slope, intercept: hs.overall.regression_intercept } : null;
      holder.append(scatterChart(record.plot.pairs, fit, { label: 'Hs', unit: 'm' }), quantileChart(record.plot.quantiles, { label: 'Hs', unit: 'm' }));
    }
  } catch (error) {
    holder.append(problemBox(error));
  }
  return holder;
}

async function yieldSection(atlas, at) {
  const devices = (await cachedJson(`${apiRoot}/devices`)).devices ?? [];
  if (!devices.length) return null;
  const select = el('select', { id: 'yield-device' }, devices.map(d => el('option', { value: d.slug }, `${d.name} (${number(d.rated_power_kw)} kW)`)));
  const result = el('div', { 'aria-live': 'polite' });
  const holder = section('yield', 'Device yield', el('label', { class: 'inline' }, 'Device ', select), result);
  const show = async () => {
    const url = `${datasetUrl(atlas.slug)}/point/yield` + query({ ...at, device: select.value });
    result.replaceChildren(el('p', { class: 'muted' }, 'Computing…'));
    try {
      const y = await getJson(url);
      result.replaceChildren(
        el('dl', { class: 'facts', 'data-field': 'yield' },
          el('dt', {}, 'Mean annual energy'), el('dd', { 'data-field': 'annual-energy' }, `${number(y.annual_energy_mwh)} MWh/yr`),
          el('dt', {}, 'Mean power'), el('dd', {}, `${number(y.mean_power_kw)} kW`),
          el('dt', {}, 'Capacity factor'), el('dd', { 'data-field': 'capacity-factor' }, percent(y.capacity_factor)),
          el('dt', {}, 'Outside the matrix'), el('dd', {}, `${percent(y.outside_matrix_fraction)} of the time (counted at 0 kW)`),
          el('dt', {}, 'Year to year'), el('dd', {}, y.interannual_cv == null ? `fewer than two complete years` : `coefficient of variation ${percent(y.interannual_cv)}`)),
        table('Mean energy by calendar month (MWh).', ['Month', 'energy', 'mean power (kW)'],
          y.months.filter(m => m.valid_steps > 0).map(m => ({ cells: [monthNames[m.month - 1], number(m.mean_energy_mwh), number(m.mean_power_kw)] }))),
        el('div', { class: 'links' }, jsonLink(url)));
    } catch (error) {
      result.replaceChildren(problemBox(error));
    }
  };
  select.addEventListener('change', show);
  await show();
  return holder;
}

async function windowsSection(atlas, at) {
  const hs = el('input', { type: 'number', min: '0', step: 'any', value: '1.5', name: 'hs_max', inputmode: 'decimal' });
  const hours = el('input', { type: 'number', min: '1', step: 'any', value: '12', name: 'hours', inputmode: 'decimal' });
  const tp = el('input', { type: 'number', min: '0', step: 'any', value: '', name: 'tp_max', inputmode: 'decimal' });
  const result = el('div', { 'aria-live': 'polite' });
  const form = el('form', { class: 'windows-form' },
    el('label', {}, 'Hs at most ', el('span', { class: 'input-unit' }, hs, el('span', {}, 'm'))),
    el('label', {}, 'Tp at most ', el('span', { class: 'input-unit' }, tp, el('span', {}, 's'))),
    el('label', {}, 'for ', el('span', { class: 'input-unit' }, hours, el('span', {}, 'hours'))),
    el('button', { type: 'submit' }, 'Compute'));
  const holder = section('windows', 'Weather windows', form, result);
  const show = async () => {
    const url = `${datasetUrl(atlas.slug)}/point/windows` + query({ ...at, hs_max: hs.value, tp_max: tp.value, hours: hours.value });
    result.replaceChildren(el('p', { class: 'muted' }, 'Computing…'));
    try {
      const w = await getJson(url);
      result.replaceChildren(
        el('p', {}, `Within the limits ${percent(w.accessible_fraction)} of the time; calm spells last ${number(w.calm_spells.mean_hours)} h on average, ` +
          `storm spells ${number(w.storm_spells.mean_hours)} h.`),
        table(`Windows of at least ${number(w.required_hours)} h by calendar month.`,
          ['Month', 'chance a window starts', 'windows a month', 'mean wait (h)', 'time within limits'],
          w.months.filter(m => m.steps > 0).map(m => ({
            cells: [monthNames[m.month - 1], percent(m.window_start_probability), number(m.mean_windows_per_month), number(m.mean_waiting_hours), percent(m.accessible_fraction)],
          })), { id: 'windows-table' }),
        el('div', { class: 'links' }, jsonLink(url)));
    } catch (error) {
      result.replaceChildren(problemBox(error));
    }
  };
  form.addEventListener('submit', e => { e.preventDefault(); show(); });
  await show();
  return holder;
}

function returnLevelRows(fit) {
  return fit.return_levels.map(r => ({
    cells: [`${number(r.return_period_years)} yr`, `${number(r.level)} m`,
      `${number(r.lower)} – ${r.upper_unbounded ? 'unbounded' : number(r.upper)} m`, r.long_extrapolation ? 'beyond 4 × the record' : ''],
  }));
}

async function extremesSection(atlas, at) {
  const url = `${datasetUrl(atlas.slug)}/point/extremes` + query(at);
  const holder = section('extremes', 'Extreme Hs');
  try {
    const x = await getJson(url);
    if (x.strong_caution) holder.append(el('p', { class: 'error-box', 'data-field': 'extremes-caution' }, x.strong_caution));
    holder.append(el('p', { class: 'muted' }, `${number(x.record_years)} years of record.`));
    const fits = [];
    const am = x.annual_maxima, pot = x.peaks_over_threshold;
    if (am?.available) {
      if (am.gev) fits.push(['Annual maxima, GEV', am.gev]);
      if (am.gumbel) fits.push(['Annual maxima, Gumbel', am.gumbel]);
    } else if (am) holder.append(el('p', { class: 'muted' }, `Annual maxima: ${am.reason}`));
    if (pot?.available && pot.gpd) fits.push([`Peaks over ${number(pot.threshold)} m, GPD (${number(pot.exceedances_per_year)} storms a year)`, pot.gpd]);
    else if (pot) holder.append(el('p', { class: 'muted' }, `Peaks over threshold: ${pot.reason}`));
    for (const [title, fit] of fits)
      holder.append(table(`${title}; 95 % profile-likelihood intervals.`, ['Return period', 'Hs', 'interval', ''], returnLevelRows(fit)));
    holder.append(el('div', { class: 'links' }, jsonLink(url)));
  } catch (error) {
    holder.append(problemBox(error));
  }
  return holder;
}

/** Appends the assessment sections the server offers to the point panel, in a fixed order as each one arrives. */
export async function renderAssessments(body, atlas, point, endpoints, stillCurrent) {
  const holder = body.querySelector('#assessment-sections');
  if (!holder) return;
  const base = `${apiRoot}/datasets/{slug}`;
  const at = { lat: point.cell.lat.toFixed(5), lon: point.cell.lon.toFixed(5) };
  const planned = [
    endpoints.has(`${base}/point/series`) ? () => seriesSection(atlas, point, at) : null,
    endpoints.has(`${apiRoot}/stations`) && endpoints.has(`${base}/validation`) ? () => validationSection(atlas, point, at) : null,
    endpoints.has(`${apiRoot}/devices`) && endpoints.has(`${base}/point/yield`) ? () => yieldSection(atlas, at) : null,
    endpoints.has(`${base}/point/windows`) ? () => windowsSection(atlas, at) : null,
    endpoints.has(`${base}/point/extremes`) ? () => extremesSection(atlas, at) : null,
  ].filter(Boolean);
  const slots = planned.map(() => el('div'));
  holder.replaceChildren(...slots);
  await Promise.all(planned.map(async (make, k) => {
    try {
      const made = await make();
      if (made && stillCurrent()) {
        slots[k].replaceWith(made);
        // Charts are drawn once in the document, where they have a width.
        for (const chart of made.querySelectorAll('figure.chart-figure')) chart.mount?.();
      }
    } catch (error) {
      if (stillCurrent()) slots[k].replaceWith(problemBox(error));
    }
  }));
  body.dataset.assessments = 'done';
}
