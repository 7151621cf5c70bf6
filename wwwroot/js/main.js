// Starts the page: finds the dataset, builds the map (no online base map unless config.json names one), draws the
// dataset's own land mask and extent, shows the first layer, and wires the panels.

/* global L */

import { apiRoot, datasetUrl, getJson, layerUrl } from './api.js';
import { AreaTool } from './area-tool.js';
import { CellCanvasLayer } from './cell-layer.js';
import { CellReadout } from './cell-readout.js';
import { loadColourScales } from './colour-scale.js';
import { el, number, periodName, position } from './format.js';
import { LayerView } from './layer-view.js';
import { drawOutputPoints } from './output-points.js';
import { PointPanel } from './point-panel.js';
import { Screening } from './screening.js';

const started = performance.now();
const colours = { land: '#d8d2c4', landHatch: '#a39a86', landEdge: '#6f6552', extent: '#25323d', highlight: '#c8006f', highlightHalo: '#ffffff' };

function readHash() {
  const params = new URLSearchParams(location.hash.slice(1));
  const lat = Number(params.get('lat')), lon = Number(params.get('lon'));
  return {
    dataset: params.get('dataset') || null,
    parameter: params.get('p') || undefined, statistic: params.get('s') || undefined, period: params.get('t') || undefined,
    point: params.has('lat') && params.has('lon') && Number.isFinite(lat) && Number.isFinite(lon) ? { lat, lon } : null,
  };
}

function landRings(geojson) {
  const rings = [];
  for (const feature of geojson.features ?? []) {
    const g = feature.geometry;
    const polygons = g?.type === 'MultiPolygon' ? g.coordinates : g?.type === 'Polygon' ? [g.coordinates] : [];
    for (const polygon of polygons) for (const ring of polygon) {
      const flat = new Float64Array((ring.length - 1) * 2);
      for (let k = 0; k < ring.length - 1; k++) { flat[2 * k] = ring[k][0]; flat[2 * k + 1] = ring[k][1]; }
      rings.push(flat);
    }
  }
  return rings;
}

/** The bounding box of footprint rings ([lon, lat, ...] flat arrays) as [[south, west], [north, east]], or null when empty. */
function ringBounds(cells) {
  let west = Infinity, east = -Infinity, south = Infinity, north = -Infinity;
  for (const { ring } of cells) for (let k = 0; k < ring.length; k += 2) {
    west = Math.min(west, ring[k]); east = Math.max(east, ring[k]);
    south = Math.min(south, ring[k + 1]); north = Math.max(north, ring[k + 1]);
  }
  return west <= east ? [[south, west], [north, east]] : null;
}

/** The API paths this server documents (its OpenAPI document), so optional endpoints are asked for only when present. */
function documentedPaths() {
  const document_ = window.atlasBoot?.openApi ?? getJson('/swagger/v1/swagger.json');
  return document_.then(d => new Set(Object.keys(d.paths ?? {}))).catch(() => new Set());
}

class Atlas {
  constructor() {
    this.colours = colours;
    this.statusLine = document.getElementById('map-status');
    this.workspace = document.getElementById('workspace');
    this.highlightActive = false;
    this.hasLand = false;
    this.timings = { started };
    window.atlasPage = this;
  }

  status(text, kind) {
    this.statusLine.textContent = text;
    this.statusLine.classList.toggle('error', kind === 'error');
  }

  async start() {
    const hash = readHash();
    const boot = window.atlasBoot ?? {};
    const [config, list] = await Promise.all([
      (boot.config ?? getJson('/config.json')).catch(() => ({})), boot.datasets ?? getJson(`${apiRoot}/datasets`),
      loadColourScales(boot.colourScales)]);
    const early = await (boot.first ?? Promise.resolve(null)).catch(() => null);
    this.config = config;
    if (list.caution) document.getElementById('caution-text').textContent = list.caution;
    if (!list.datasets.length) {
      document.getElementById('dataset-title').textContent = 'No dataset is loaded on this server yet.';
      this.status('No dataset: load one with the atlas command line (atlas ingest, or atlas demo).', 'error');
      return;
    }
    const chosen = list.datasets.find(d => d.slug === hash.dataset) ?? list.datasets[0];
    this.slug = chosen.slug;
    if (list.datasets.length > 1) {
      const select = document.getElementById('dataset-select');
      select.replaceChildren(...list.datasets.map(d => el('option', { value: d.slug }, d.title)));
      select.value = this.slug;
      select.addEventListener('change', () => { location.hash = `dataset=${encodeURIComponent(select.value)}`; location.reload(); });
      document.getElementById('dataset-choice').hidden = false;
    }
    document.getElementById('dataset-title').textContent = chosen.title;

    this.buildMap(chosen.extent);
    // Everything the first picture needs, at once: the first layer (footprints and values in one document) and the
    // layer catalogue; the land mask and the description follow.
    const wish = { parameter: hash.parameter ?? 'j', statistic: hash.statistic ?? 'mean', period: hash.period ?? 'annual' };
    const fromBoot = early && early.slug === this.slug;
    const firstLayer = fromBoot ? early.layerDocument
      : getJson(layerUrl(this.slug, wish.parameter, wish.statistic, wish.period, 'geojson') + '?geometry=polygon');
    firstLayer.catch(() => {});
    this.endpoints = documentedPaths();
    const land = this.endpoints.then(paths => paths.has(`${apiRoot}/datasets/{slug}/land`) ? getJson(`${datasetUrl(this.slug)}/land`) : null);
    // The description (provenance, time coverage) is not needed for the first picture: shown when it arrives.
    (fromBoot ? early.detail : getJson(datasetUrl(this.slug))).then(detail => {
      this.detail = detail;
      if (detail.caution) document.getElementById('caution-text').textContent = detail.caution;
      this.describe(detail);
      this.outputPoints = drawOutputPoints(this, detail);
      if (this.outputPoints) this.layers?.paint();
    }).catch(error => this.status(`The dataset description could not be loaded. ${error.message}`, 'error'));
    const catalogue = await (fromBoot ? early.catalogue : getJson(`${datasetUrl(this.slug)}/layers`));
    this.catalogue = catalogue;
    land.then(mask => {
      const rings = mask ? landRings(mask) : [];
      this.hasLand = rings.length > 0;
      this.cells.setLand(rings);
      this.landBounds = ringBounds(rings.map(ring => ({ ring })));
      this.drawGridExtent();
      this.layers?.paint();
    }).catch(error => this.status(`The land mask could not be loaded. ${error.message}`, 'error'));

    this.layers = new LayerView(this);
    this.readout = new CellReadout(this);
    this.point = new PointPanel(this);
    this.screening = new Screening(this);
    this.area = new AreaTool(this);
    this.cells.on('painted', () => {
      if (!this.timings.firstLayerMs && this.layers.current) {
        // performance.now() counts from the start of navigation, so this is the time a user waits for colour.
        this.timings.firstLayerMs = performance.now();
        this.timings.sinceScriptMs = this.timings.firstLayerMs - started;
        performance.mark('atlas:first-layer');
        document.body.dataset.firstLayerMs = this.timings.firstLayerMs.toFixed(0);
      }
    });
    this.layers.onChange(layer => this.writeHash(layer));
    this.layers.onChange(() => this.readout.refresh());

    if (catalogue.parameters.length === 0) {
      this.status('This dataset has no statistics yet: run atlas stats for it.', 'error');
      return;
    }
    const choice = this.layers.setCatalogue(catalogue, wish);
    const same = choice.parameter === wish.parameter && choice.statistic === wish.statistic && choice.period === wish.period;
    try {
      await this.layers.showFirst(choice, same ? firstLayer : undefined);
    } catch (error) {
      this.status(`The layer could not be loaded. ${error.message}`, 'error');
    }
    document.body.dataset.ready = 'true';
    if (hash.point) this.point.open(hash.point.lat, hash.point.lon);
  }

  buildMap(extent) {
    const map = L.map('map', { zoomSnap: 0.25, preferCanvas: false, attributionControl: true, keyboardPanDelta: 60 });
    this.map = map;
    map.attributionControl.setPrefix(false);
    const base = this.config?.baseMap;
    if (base?.url) {
      L.tileLayer(base.url, { attribution: base.attribution ?? '', maxZoom: base.maxZoom ?? 18, opacity: base.opacity ?? 1 }).addTo(map);
    }
    this.cells = new CellCanvasLayer({
      landColour: colours.land, landHatch: colours.landHatch, landEdge: colours.landEdge, highlightColour: colours.highlight, highlightHalo: colours.highlightHalo, veil: 'rgba(243, 245, 246, 0.68)',
    }).addTo(map);
    if (extent) {
      const bounds = L.latLngBounds([extent.south, extent.west], [extent.north, extent.east]);
      this.extentBounds = bounds;
      this.extentRectangle = L.rectangle(bounds, { color: colours.extent, weight: 1.5, dashArray: '6 4', fill: false, interactive: false }).addTo(map);
      // Leave room for the colour bar, which covers the foot of the map on a narrow screen.
      const fit = () => map.fitBounds(bounds, { paddingTopLeft: [12, 12], paddingBottomRight: [12, window.innerWidth <= 900 ? 120 : 12] });
      fit();
      requestAnimationFrame(() => { map.invalidateSize({ pan: false }); fit(); });
    } else {
      map.setView([0, 0], 2);
    }
    L.control.scale({ imperial: false, position: 'bottomleft' }).addTo(map);

    map.on('click', e => {
      if (this.area?.drawing) return;
      this.point.open(e.latlng.lat, e.latlng.lng);
    });
    map.getContainer().addEventListener('keydown', e => {
      if (e.target !== map.getContainer() || e.key !== 'Enter') return;
      e.preventDefault();
      const centre = map.getCenter();
      if (this.area?.drawing) this.area.addVertex(centre);
      else this.point.open(centre.lat, centre.lng);
    });
  }

  /** Takes the outer edges of the sea cells' footprints for the extent outline. */
  showCellExtent(cells) {
    this.seaBounds = ringBounds(cells);
    this.drawGridExtent();
  }

  /**
   * Draws the extent outline round the whole grid: the outer edges of the sea cells' footprints and of the land
   * mask's dry cells together (the API's extent, of cell centres, until they arrive), so that it never cuts through
   * land at the grid's edge.
   */
  drawGridExtent() {
    if (!this.extentRectangle) return;
    const parts = [this.seaBounds, this.landBounds].filter(Boolean);
    if (!parts.length) return;
    const bounds = L.latLngBounds(parts[0]);
    for (const part of parts.slice(1)) bounds.extend(part);
    this.extentRectangle.setBounds(bounds);
  }

  /** Shows or hides the point column (wide screens) and lets the map use the space. */
  setPointPanelOpen(open, keepInView) {
    this.workspace.classList.toggle('with-point', open);
    requestAnimationFrame(() => {
      this.map.invalidateSize({ pan: false });
      // The map is narrower with the panel open: bring the read position back into view if it fell outside.
      if (keepInView && !this.map.getBounds().pad(-0.05).contains(keepInView)) this.map.panTo(keepInView, { animate: false });
    });
  }

  writeHash(layer, point = this.point?.position) {
    const params = new URLSearchParams();
    if (this.detail && document.getElementById('dataset-select').options.length > 1) params.set('dataset', this.slug);
    if (layer) { params.set('p', layer.parameter); params.set('s', layer.statistic); params.set('t', layer.period); }
    if (point) { params.set('lat', point.lat.toFixed(5)); params.set('lon', point.lon.toFixed(5)); }
    history.replaceState(null, '', '#' + params.toString());
  }

  describe(detail) {
    const list = document.getElementById('about-list');
    const time = detail.time ?? {};
    const years = time.years?.length ? `${time.years[0]}–${time.years[time.years.length - 1]}` : '–';
    const step = time.step_seconds ? `${Number((time.step_seconds / 3600).toFixed(2))} h` : '–';
    const extent = detail.extent;
    const rows = [
      ['Grid', `${detail.grid_kind}${detail.nx ? ` ${detail.nx} × ${detail.ny}` : ''}`],
      ['Sea cells', `${detail.wet_cell_count.toLocaleString('en-GB')} of ${detail.point_count.toLocaleString('en-GB')}`],
      ['Years', years],
      ['Time step', `${step}, ${time.step_count?.toLocaleString('en-GB') ?? '–'} steps`],
      ['Extent', extent ? `${position(extent.south, extent.west)} to ${position(extent.north, extent.east)}` : '–'],
      ['Source files', String(detail.source_files?.length ?? 0)],
      ['Licence', detail.licence ?? '–'],
    ];
    if (detail.citation) rows.push(['Citation', detail.citation]);
    list.replaceChildren(...rows.flatMap(([k, v]) => [el('dt', {}, k), el('dd', {}, v)]));
    const api = document.getElementById('about-api');
    api.replaceChildren('The same numbers by URL: ',
      el('a', { href: datasetUrl(this.slug) }, 'dataset description (JSON)'), ', ',
      el('a', { href: `${datasetUrl(this.slug)}/layers` }, 'layer list'), ', ',
      el('a', { href: '/swagger' }, 'API documentation'), '.');
    if (detail.method_notes) api.after(el('details', { class: 'muted' }, el('summary', {}, 'Method notes'), el('p', {}, detail.method_notes)));
  }
}

export { periodName };

new Atlas().start().catch(error => {
  const status = document.getElementById('map-status');
  status.textContent = `The atlas could not start: ${error.message}`;
  status.classList.add('error');
});
