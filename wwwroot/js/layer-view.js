// The layer view: parameter, statistic and period selectors, the cell colours on the map, the colour bar and the
// download links of the current layer. Footprints come once from the first layer's GeoJSON (cell polygons); every
// later layer is fetched as CSV (cell id and value), which is about a tenth of the size.

import { getJson, getText, layerUrl, parseLayerCsv } from './api.js';
import { cyclicScale, sequentialScale } from './colour-scale.js';
import { drawColourBar, niceRange } from './colour-bar.js';
import { el, number, periodName, periodPhrase } from './format.js';

const formats = [
  ['tif', 'GeoTIFF'],
  ['csv', 'CSV'],
  ['geojson', 'GeoJSON'],
  ['nc', 'NetCDF'],
  ['png', 'PNG figure'],
  ['svg', 'SVG figure'],
];

const parameterOrder = ['j', 'hs', 'te', 'tp', 'dir', 'spread', 'd', 'depth'];

// Short labels for the selector; a parameter this list lacks is labelled from the catalogue.
const parameterLabels = {
  j: 'Wave power J', hs: 'Significant wave height Hs', te: 'Energy period Te', tp: 'Peak period Tp',
  dir: 'Mean wave direction', spread: 'Directional spread', d: 'Directionality coefficient', depth: 'Depth',
};

function capitalised(text) {
  return text ? text[0].toUpperCase() + text.slice(1) : text;
}

/** Flat [lon, lat, ...] ring of a GeoJSON polygon's exterior, without the closing repeat. */
function ringOf(geometry) {
  const ring = geometry?.type === 'Polygon' ? geometry.coordinates[0] : null;
  if (!ring || ring.length < 4) return null;
  const flat = new Float64Array((ring.length - 1) * 2);
  for (let k = 0; k < ring.length - 1; k++) { flat[2 * k] = ring[k][0]; flat[2 * k + 1] = ring[k][1]; }
  return flat;
}

export class LayerView {
  constructor(atlas) {
    this.atlas = atlas;
    this.form = document.getElementById('layer-form');
    this.parameterSelect = document.getElementById('layer-parameter');
    this.statisticSelect = document.getElementById('layer-statistic');
    this.periodSelect = document.getElementById('layer-period');
    this.legend = document.getElementById('map-legend');
    this.facts = document.getElementById('layer-facts');
    this.downloads = document.getElementById('layer-downloads');
    this.footprints = new Map();
    this.halfSide = null;
    this.current = null;
    this.manualRange = null;
    this.requestSerial = 0;
    this.listeners = [];

    this.parameterSelect.addEventListener('change', () => { this.fillStatisticAndPeriod(); this.manualRange = null; this.show(); });
    this.statisticSelect.addEventListener('change', () => { this.manualRange = null; this.show(); });
    this.periodSelect.addEventListener('change', () => this.show());
    document.getElementById('range-form').addEventListener('submit', e => {
      e.preventDefault();
      const lo = Number(document.getElementById('range-min').value), hi = Number(document.getElementById('range-max').value);
      if (Number.isFinite(lo) && Number.isFinite(hi) && hi > lo) { this.manualRange = [lo, hi]; this.paint(); }
      else this.atlas.status('The colour range needs two numbers, the second larger than the first.', 'error');
    });
    document.getElementById('range-reset').addEventListener('click', () => { this.manualRange = null; this.paint(); });
  }

  /** Calls `listener(layer)` whenever a new layer is drawn. */
  onChange(listener) { this.listeners.push(listener); }

  /** Fills the selectors from the catalogue, choosing `initial` ({ parameter, statistic, period }) when offered. */
  setCatalogue(catalogue, initial) {
    this.catalogue = catalogue;
    this.parameters = [...catalogue.parameters].sort((a, b) => parameterOrder.indexOf(a.symbol) - parameterOrder.indexOf(b.symbol));
    this.statisticNames = Object.fromEntries(catalogue.statistics.map(s => [s.name, s.description]));
    this.parameterSelect.replaceChildren(...this.parameters.map(p =>
      el('option', { value: p.symbol, title: p.name }, `${parameterLabels[p.symbol] ?? capitalised(p.name)} (${p.units})`)));
    const choice = this.resolve(initial);
    this.parameterSelect.value = choice.parameter;
    this.fillStatisticAndPeriod(choice);
    return choice;
  }

  /** The nearest offered layer to a wish: the wished parameter, statistic and period where they exist. */
  resolve(wish = {}) {
    const parameter = this.parameters.find(p => p.symbol === wish.parameter) ?? this.parameters.find(p => p.symbol === 'j') ?? this.parameters[0];
    const statistic = parameter.statistics.includes(wish.statistic) ? wish.statistic : parameter.statistics.includes('mean') ? 'mean' : parameter.statistics[0];
    const period = parameter.periods.includes(wish.period) ? wish.period : parameter.periods.includes('annual') ? 'annual' : parameter.periods[0];
    return { parameter: parameter.symbol, statistic, period };
  }

  fillStatisticAndPeriod(choice) {
    const parameter = this.parameters.find(p => p.symbol === this.parameterSelect.value);
    const keepStatistic = choice?.statistic ?? this.statisticSelect.value;
    const keepPeriod = choice?.period ?? this.periodSelect.value;
    this.statisticSelect.replaceChildren(...parameter.statistics.map(s =>
      el('option', { value: s }, !this.statisticNames[s] || this.statisticNames[s].startsWith(s) ? capitalised(this.statisticNames[s] ?? s) : `${capitalised(this.statisticNames[s])} (${s})`)));
    this.statisticSelect.value = parameter.statistics.includes(keepStatistic) ? keepStatistic : parameter.statistics.includes('mean') ? 'mean' : parameter.statistics[0];
    const groups = [
      ['Whole record', parameter.periods.filter(p => p === 'annual')],
      ['Seasons', parameter.periods.filter(p => ['djf', 'mam', 'jja', 'son'].includes(p))],
      ['Months', parameter.periods.filter(p => /^[a-z]{3}$/.test(p) && !['djf', 'mam', 'jja', 'son'].includes(p))],
      ['Single years', parameter.periods.filter(p => /^y\d{4}$/.test(p))],
    ].filter(([, list]) => list.length);
    this.periodSelect.replaceChildren(...groups.map(([label, list]) =>
      el('optgroup', { label }, list.map(p => el('option', { value: p }, periodName(p))))));
    this.periodSelect.value = parameter.periods.includes(keepPeriod) ? keepPeriod : parameter.periods.includes('annual') ? 'annual' : parameter.periods[0];
  }

  selection() {
    return { parameter: this.parameterSelect.value, statistic: this.statisticSelect.value, period: this.periodSelect.value };
  }

  /** The unit of a statistic of a parameter: count and coverage are dimensionless. */
  unitsOf(parameter, statistic) {
    if (statistic === 'count') return 'steps';
    if (statistic === 'coverage') return '1';
    return this.parameters.find(p => p.symbol === parameter)?.units ?? '';
  }

  titleOf({ parameter, statistic, period }) {
    if (parameter === 'dir' && statistic === 'mean') return `Power-weighted mean direction the waves come from, ${periodPhrase(period)}`;
    const p = this.parameters.find(x => x.symbol === parameter);
    const label = parameterLabels[parameter] ?? p?.name ?? parameter;
    return `${capitalised(this.statisticNames[statistic] ?? statistic)} of ${label[0].toLowerCase() + label.slice(1)}, ${periodPhrase(period)}`;
  }

  /**
   * Loads the first layer as GeoJSON with cell footprints (one request gives geometry and values), or takes an
   * already fetched promise of that document.
   */
  async showFirst(choice, fetched) {
    const serial = ++this.requestSerial;
    const document_ = await (fetched ?? getJson(layerUrl(this.atlas.slug, choice.parameter, choice.statistic, choice.period, 'geojson') + '?geometry=polygon'));
    if (serial !== this.requestSerial) return;
    const values = new Map();
    const cells = [];
    for (const feature of document_.features) {
      const id = feature.properties.cell_id;
      const ring = ringOf(feature.geometry);
      if (ring) { this.footprints.set(id, ring); cells.push({ id, ring }); }
      if (Number.isFinite(feature.properties.value)) values.set(id, feature.properties.value);
    }
    this.halfSide = this.typicalHalfSide(cells);
    this.atlas.cells.setCells(cells);
    this.atlas.showCellExtent(cells);
    this.apply(choice, values);
  }

  /** Half the typical footprint width (degrees), for drawing a cell that arrives without a footprint. */
  typicalHalfSide(cells) {
    const widths = cells.slice(0, 400).map(c => {
      let lo = Infinity, hi = -Infinity;
      for (let k = 1; k < c.ring.length; k += 2) { lo = Math.min(lo, c.ring[k]); hi = Math.max(hi, c.ring[k]); }
      return hi - lo;
    }).sort((a, b) => a - b);
    return widths.length ? widths[widths.length >> 1] / 2 : 0.01;
  }

  /** Draws the layer the selectors name. */
  async show() {
    const choice = this.selection();
    const serial = ++this.requestSerial;
    this.atlas.status(`Loading ${this.titleOf(choice)}…`);
    try {
      const text = await getText(layerUrl(this.atlas.slug, choice.parameter, choice.statistic, choice.period, 'csv'));
      if (serial !== this.requestSerial) return;
      const rows = parseLayerCsv(text);
      const values = new Map();
      let added = false;
      for (let k = 0; k < rows.ids.length; k++) {
        values.set(rows.ids[k], rows.values[k]);
        if (!this.footprints.has(rows.ids[k])) {
          const h = this.halfSide ?? 0.01, x = rows.lons[k], y = rows.lats[k];
          this.footprints.set(rows.ids[k], new Float64Array([x - h, y - h, x + h, y - h, x + h, y + h, x - h, y + h]));
          added = true;
        }
      }
      if (added) this.atlas.cells.setCells([...this.footprints].map(([id, ring]) => ({ id, ring })));
      this.apply(choice, values);
      this.atlas.status('');
    } catch (error) {
      if (serial === this.requestSerial) this.atlas.status(`The layer could not be loaded. ${error.message}`, 'error');
    }
  }

  apply(choice, values) {
    let lo = Infinity, hi = -Infinity;
    for (const v of values.values()) { if (v < lo) lo = v; if (v > hi) hi = v; }
    this.current = {
      ...choice, values, dataMin: lo, dataMax: hi,
      units: this.unitsOf(choice.parameter, choice.statistic),
      title: this.titleOf(choice),
      cyclic: choice.parameter === 'dir' && choice.statistic === 'mean',
    };
    this.paint();
    this.writeDownloads();
    for (const listener of this.listeners) listener(this.current);
  }

  /** Colours the cells and redraws the colour bar for the current range. */
  paint() {
    const layer = this.current;
    if (!layer) return;
    const scale = layer.cyclic ? cyclicScale : sequentialScale;
    const [lo, hi] = layer.cyclic ? [0, 360] : this.manualRange ?? niceRange(layer.dataMin, layer.dataMax);
    layer.lo = lo; layer.hi = hi;
    document.getElementById('range-min').value = String(lo);
    document.getElementById('range-max').value = String(hi);
    const colours = new Map();
    const span = hi - lo || 1;
    for (const [id, v] of layer.values) colours.set(id, scale.css((v - lo) / span));
    this.atlas.cells.setColours(id => colours.get(id));
    drawColourBar(this.legend, {
      title: capitalised(layer.title), units: layer.units, scale, lo, hi, cyclic: layer.cyclic,
      highlight: this.atlas.highlightActive, land: this.atlas.hasLand ? this.atlas.colours.land : null,
      outputPoints: Boolean(this.atlas.outputPoints), readout: this.atlas.readout?.node,
    });
    const parameter = this.parameters.find(p => p.symbol === layer.parameter);
    const binNote = ['p10', 'p50', 'p90', 'p99'].includes(layer.statistic) && parameter?.percentile_bin_width
      ? ` Layer percentiles come from histograms with ${parameter.percentile_bin_width} ${parameter.units} bins; point statistics are exact.` : '';
    this.facts.textContent = layer.values.size
      ? `${layer.values.size.toLocaleString('en-GB')} cells with a value, from ${number(layer.dataMin)} to ${number(layer.dataMax)} ${layer.units}.${binNote}`
      : 'No cell has a value for this layer.';
  }

  writeDownloads() {
    const { parameter, statistic, period } = this.current;
    const base = `${this.atlas.slug}_${parameter}_${statistic}_${period}`;
    this.downloads.replaceChildren(
      el('span', { class: 'visually-hidden' }, 'Download the current layer as'),
      ...formats.map(([format, label]) => el('a', {
        href: layerUrl(this.atlas.slug, parameter, statistic, period, format),
        download: `${base}.${format}`, 'data-format': format,
      }, label)));
  }
}
