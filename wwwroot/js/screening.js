// Site screening: the criteria form, the matching cells outlined on the map, their count, total area and a GeoJSON
// download of the same answer (the download link is the very request the page made).

import { datasetUrl, getJson, query } from './api.js';
import { el, number, periodName } from './format.js';

const fields = ['min_power_kw_m', 'min_depth_m', 'max_depth_m', 'max_coast_distance_km', 'max_hs_p90_m'];

const criterionText = {
  min_power_kw_m: v => `mean power ≥ ${v} kW/m`,
  min_depth_m: v => `depth ≥ ${v} m`,
  max_depth_m: v => `depth ≤ ${v} m`,
  max_coast_distance_km: v => `≤ ${v} km from the coast`,
  max_hs_p90_m: v => `Hs p90 ≤ ${v} m`,
};

export class Screening {
  constructor(atlas) {
    this.atlas = atlas;
    this.form = document.getElementById('screen-form');
    this.result = document.getElementById('screen-result');
    this.clearButton = document.getElementById('screen-clear');
    const periodSelect = document.getElementById('screen-period');
    const power = atlas.catalogue.parameters.find(p => p.symbol === 'j');
    const periods = power?.periods ?? ['annual'];
    periodSelect.replaceChildren(...periods.map(p => el('option', { value: p }, periodName(p))));
    periodSelect.value = periods.includes('annual') ? 'annual' : periods[0];
    this.form.addEventListener('submit', e => { e.preventDefault(); this.run(); });
    this.clearButton.addEventListener('click', () => this.clear());
  }

  criteria() {
    const data = new FormData(this.form);
    const values = { period: data.get('period') };
    for (const name of fields) {
      const text = String(data.get(name) ?? '').trim();
      if (text !== '') values[name] = text;
    }
    return values;
  }

  async run() {
    const criteria = this.criteria();
    const url = `${datasetUrl(this.atlas.slug)}/screen` + query(criteria);
    this.result.classList.remove('error');
    this.result.replaceChildren('Screening…');
    try {
      const answer = await getJson(url);
      const ids = new Set(answer.features.map(f => f.properties?.cell_id ?? f.id));
      this.atlas.highlightActive = ids.size > 0;
      this.atlas.cells.setHighlight(ids.size ? ids : null);
      this.atlas.layers.paint();
      this.clearButton.disabled = false;
      const stated = Object.entries(answer.criteria ?? {}).filter(([k, v]) => k !== 'period' && v !== null);
      this.result.replaceChildren(
        el('p', {}, el('span', { class: 'big-number', 'data-field': 'screen-count' }, answer.count.toLocaleString('en-GB')),
          ` cell${answer.count === 1 ? '' : 's'} meet${answer.count === 1 ? 's' : ''} every criterion, covering `,
          el('strong', { 'data-field': 'screen-area' }, `${number(answer.total_area_km2)} km²`), '.'),
        el('p', { class: 'muted' }, `${periodName(answer.criteria?.period ?? criteria.period)}; ` +
          (stated.length ? stated.map(([k, v]) => criterionText[k]?.(v) ?? `${k} ${v}`).join(', ') : 'no criterion given: every wet cell with statistics') + '.'),
        el('a', { class: 'button-link', href: url, download: `${this.atlas.slug}_screening.geojson`, 'data-link': 'screen-geojson' },
          'Download these cells (GeoJSON)'));
    } catch (error) {
      this.result.classList.add('error');
      this.result.replaceChildren(error.message);
    }
  }

  clear() {
    this.atlas.highlightActive = false;
    this.atlas.cells.setHighlight(null);
    this.atlas.layers.paint();
    this.result.replaceChildren();
    this.clearButton.disabled = true;
  }
}
