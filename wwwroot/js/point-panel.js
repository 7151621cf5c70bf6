// The point panel: everything the API computes exactly from the series of the wet cell nearest a clicked position.

/* global L */

import { datasetUrl, getJson, query } from './api.js';
import { renderAssessments } from './assessment.js';
import { exceedanceChart, interAnnualChart, monthlyMeansChart, seriesColours } from './charts.js';
import { el, fixed, number, percent, periodName, position } from './format.js';
import { jointOccurrenceTable } from './joint-table.js';
import { spectralSection } from './output-points.js';
import { powerRoseSvg } from './power-rose.js';

const rows = [
  ['hs', 'Hs', 'm'], ['te', 'Te', 's'], ['tp', 'Tp', 's'], ['j', 'J', 'kW/m'], ['spread', 'Spread', '°'],
];

export class PointPanel {
  constructor(atlas) {
    this.atlas = atlas;
    this.panel = document.getElementById('point-panel');
    this.body = document.getElementById('point-body');
    this.serial = 0;
    this.position = null;
    document.getElementById('point-close').addEventListener('click', () => this.close());
    this.panel.addEventListener('keydown', e => { if (e.key === 'Escape') this.close(); });
    document.getElementById('read-form').addEventListener('submit', e => {
      e.preventDefault();
      const data = new FormData(e.target);
      const lat = Number(data.get('lat')), lon = Number(data.get('lon'));
      if (Number.isFinite(lat) && Number.isFinite(lon)) {
        this.atlas.map.panTo([lat, lon]);
        this.open(lat, lon);
      }
    });
    this.markers = L.layerGroup().addTo(atlas.map);
  }

  close() {
    this.panel.hidden = true;
    this.position = null;
    this.markers.clearLayers();
    this.atlas.setPointPanelOpen(false);
    this.atlas.writeHash(this.atlas.layers?.current, null);
    this.atlas.map.getContainer().focus();
  }

  urls(lat, lon) {
    const base = `${datasetUrl(this.atlas.slug)}/point`;
    const at = { lat: lat.toFixed(5), lon: lon.toFixed(5) };
    return {
      json: base + query(at),
      csv: base + query({ ...at, format: 'csv' }),
      series: `${base}/series` + query(at),
      report: `${base}/report.pdf` + query(at),
    };
  }

  async open(lat, lon) {
    const serial = ++this.serial;
    this.position = { lat, lon };
    this.panel.hidden = false;
    this.atlas.setPointPanelOpen(true, L.latLng(lat, lon));
    this.markers.clearLayers();
    L.circleMarker([lat, lon], { radius: 5, color: '#111', weight: 2, fillColor: '#fff', fillOpacity: 1, interactive: false }).addTo(this.markers);
    this.body.replaceChildren(el('p', { class: 'muted' }, `Reading ${position(lat, lon)}…`));
    this.body.dataset.assessments = 'pending';
    this.atlas.writeHash(this.atlas.layers?.current, this.position);
    const urls = this.urls(lat, lon);
    try {
      const point = await getJson(urls.json);
      if (serial !== this.serial) return;
      this.render(point, urls, lat, lon);
      this.outlineCell(point.cell);
      // On a narrow screen the panel lies under the map: bring its first lines into view.
      if (window.matchMedia('(max-width: 900px)').matches) this.panel.querySelector('.point-head').scrollIntoView({ block: 'nearest' });
      const endpoints = await this.atlas.endpoints;
      if (serial === this.serial) await renderAssessments(this.body, this.atlas, point, endpoints, () => serial === this.serial);
    } catch (error) {
      if (serial !== this.serial) return;
      this.body.replaceChildren(
        el('div', { class: 'error-box', role: 'alert' }, error.status === 422 ? `No statistics here. ${error.detail || error.message}` : error.message),
        el('p', { class: 'muted' }, 'Click a coloured sea cell inside the dashed extent.'));
    }
  }

  outlineCell(cell) {
    const ring = this.atlas.layers?.footprints.get(cell.id);
    if (!ring) return;
    const latLngs = [];
    for (let k = 0; k < ring.length; k += 2) latLngs.push([ring[k + 1], ring[k]]);
    L.polygon(latLngs, { color: '#111', weight: 2.5, fill: false, interactive: false }).addTo(this.markers);
  }

  render(point, urls, lat, lon) {
    const cell = point.cell;
    const annual = point.periods.find(p => p.period === 'annual') ?? point.periods[0];
    const head = el('div', { class: 'point-summary' },
      el('p', { class: 'big-number', 'data-field': 'annual-power' },
        annual ? `${number(annual.j.mean)} kW/m` : '–', el('span', { class: 'muted' }, ' mean power over the whole record')),
      el('dl', { class: 'facts' },
        el('dt', {}, 'Cell'), el('dd', { 'data-field': 'cell-id' }, `${cell.id} at ${position(cell.lat, cell.lon)}`),
        el('dt', {}, 'Clicked'), el('dd', {}, position(lat, lon)),
        el('dt', {}, 'Cell centre is'), el('dd', { 'data-field': 'distance' }, `${number(cell.distance_m / 1000)} km from the clicked position`),
        el('dt', {}, 'Depth'), el('dd', { 'data-field': 'depth' }, cell.depth_m == null ? 'unknown (deep water assumed)' : `${fixed(cell.depth_m, 1)} m`),
        el('dt', {}, 'Distance to the coast'), el('dd', { 'data-field': 'coast-distance' }, cell.coast_distance_m == null ? '–' : `${number(cell.coast_distance_m / 1000)} km`),
        el('dt', {}, 'Record'), el('dd', {}, `${point.steps_in_window.toLocaleString('en-GB')} steps` +
          (point.energy_period_source && point.energy_period_source !== 'provided' ? `; Te ${String(point.energy_period_source).replaceAll('_', ' ')}` : '')),
      ),
      point.deep_water_assumed ? el('p', { class: 'muted' }, 'The cell depth is unknown: power uses the deep-water limit.') : null,
      el('div', { class: 'links' },
        el('a', { class: 'button-link', href: urls.json, 'data-link': 'point-json' }, 'These statistics as JSON'),
        el('a', { class: 'button-link', href: urls.csv, download: `${this.atlas.slug}_point_${cell.id}.csv`, 'data-link': 'point-csv' }, 'as CSV'),
        el('a', { class: 'button-link', href: urls.series, download: `${this.atlas.slug}_series_${cell.id}.csv`, 'data-link': 'series-csv' }, 'Time series (CSV)'),
        el('a', { class: 'button-link', href: urls.report, download: `${this.atlas.slug}_site_report_cell_${cell.id}.pdf`, 'data-link': 'site-report' }, 'Report (PDF)')),
    );

    const tableHolder = el('div');
    const periodSelect = el('select', { id: 'point-period' },
      point.periods.map(p => el('option', { value: p.period }, periodName(p.period))));
    periodSelect.value = annual?.period ?? '';
    const drawTable = () => tableHolder.replaceChildren(this.summaryTable(point.periods.find(p => p.period === periodSelect.value), point.power_from));
    periodSelect.addEventListener('change', drawTable);
    drawTable();

    const sections = [
      head,
      el('h3', {}, 'Statistics by period'),
      el('label', { class: 'inline' }, 'Period ', periodSelect),
      tableHolder,
      el('h3', {}, 'Monthly means'),
    ];
    const figures = [];
    const monthly = monthlyMeansChart(point.periods);
    figures.push(monthly);
    sections.push(monthly);

    if (point.exceedance) {
      sections.push(el('h3', {}, 'Exceedance'));
      for (const [key, label, units] of [['hs', 'Hs', 'm'], ['j', 'J', 'kW/m']]) {
        if (!point.exceedance[key]) continue;
        const figure = exceedanceChart(point.exceedance[key], { label, units, colour: seriesColours[key] });
        figures.push(figure);
        sections.push(figure);
      }
    }
    if (point.joint_occurrence) {
      sections.push(el('h3', {}, 'Joint occurrence of Hm0 and Te'), jointOccurrenceTable(point.joint_occurrence));
    }
    if (point.power_rose && point.power_rose.fractions?.length) {
      sections.push(el('h3', {}, 'Power rose'),
        el('p', { class: 'muted' }, 'Share of the energy flux by the direction the waves come from (degrees true); wedge area is proportional to the share.'),
        powerRoseSvg(point.power_rose, seriesColours.j));
    }
    if (point.inter_annual?.length) {
      sections.push(el('h3', {}, 'Inter-annual variation'));
      const annualSeries = point.inter_annual.find(s => s.period === 'annual');
      if (annualSeries && annualSeries.years.length) {
        const figure = interAnnualChart(annualSeries);
        figures.push(figure);
        sections.push(figure);
      }
      sections.push(this.variationTable(point.inter_annual));
    }
    const spectral = spectralSection(point);
    sections.push(...spectral.sections);
    figures.push(...spectral.figures);
    sections.push(el('div', { id: 'assessment-sections' }));
    this.body.replaceChildren(...sections);
    for (const figure of figures) figure.mount();
  }

  summaryTable(period, powerFrom) {
    if (!period) return el('p', { class: 'muted' }, 'No period.');
    const head = ['', 'mean', 'p10', 'p50', 'p90', 'p99', 'max'];
    const body = rows.map(([key, label, units]) => {
      const s = period[key];
      return el('tr', { 'data-parameter': key },
        el('th', { scope: 'row' }, `${label} (${units})`),
        ...['mean', 'p10', 'p50', 'p90', 'p99', 'max'].map(k => el('td', { 'data-statistic': k }, number(s?.[k]))));
    });
    const d = period.direction;
    body.push(el('tr', { 'data-parameter': 'dir' },
      el('th', { scope: 'row' }, 'Direction (° from)'),
      el('td', { 'data-statistic': 'mean' }, fixed(d?.mean, 0)),
      el('td', { colspan: '5', class: 'muted' }, d?.spread == null ? '' : `power-weighted mean; spread ${fixed(d.spread, 0)}°`)));
    body.push(el('tr', { 'data-parameter': 'd' },
      el('th', { scope: 'row' }, 'Directionality d (1)'),
      el('td', { 'data-statistic': 'mean' }, number(d?.directionality_coefficient)),
      el('td', { colspan: '5', class: 'muted' }, d?.max_power_from_deg == null ? '' :
        `largest mean resolved power from ${fixed(d.max_power_from_deg, 0)}°; ` +
        (powerFrom === 'spectra' ? 'from the period-mean resolved power of the spectra' : "each step's spreading modelled (cosine-2s)"))));
    const coverages = [...rows.map(([key, label]) => [label, period[key]?.coverage]), ['Direction', d?.coverage]];
    const same = coverages.every(([, c]) => c === coverages[0][1]);
    const coverageText = same ? `coverage ${percent(coverages[0][1], 0)}`
      : 'coverage ' + coverages.map(([label, c]) => `${label} ${percent(c, 0)}`).join(', ');
    return el('div', { class: 'table-scroll' }, el('table', { class: 'stats-table', id: 'point-stats' },
      el('caption', {}, `${periodName(period.period)}: ${period.expected_steps.toLocaleString('en-GB')} steps expected, ${coverageText}` +
        (period.low_coverage ? ' — low coverage, read with care' : '') + '. Percentiles are exact, from the series.'),
      el('thead', {}, el('tr', {}, head.map(h => el('th', { scope: 'col' }, h)))),
      el('tbody', {}, body)));
  }

  variationTable(series) {
    return el('div', { class: 'table-scroll' }, el('table', { class: 'stats-table' },
      el('caption', {}, 'Coefficient of variation of the yearly means (sample standard deviation over the mean), years with enough coverage; ' +
        'a winter is December with the January and February after it.'),
      el('thead', {}, el('tr', {}, ['Period', 'Years', 'Left out', 'Hs', 'Te', 'J'].map(h => el('th', { scope: 'col' }, h)))),
      el('tbody', {}, series.map(s => el('tr', {},
        el('th', { scope: 'row' }, periodName(s.period)),
        el('td', {}, String(s.years_used)),
        el('td', {}, (s.years_left_out ?? []).map(y => s.years.find(r => r.year === y)?.label ?? String(y)).join(', ') || 'none'),
        el('td', {}, percent(s.hs_coefficient_of_variation)),
        el('td', {}, percent(s.te_coefficient_of_variation)),
        el('td', {}, percent(s.j_coefficient_of_variation)))))));
  }
}
