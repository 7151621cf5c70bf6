// Area statistics: draw a polygon on the map (click the corners; Finish, a double click or Enter on a button ends it;
// Escape cancels; Backspace removes the last corner; with the map focused, Enter adds the map centre as a corner) or
// upload a GeoJSON file, then ask the API for the current layer's statistics over the cells inside.

/* global L */

import { datasetUrl, postJson, query } from './api.js';
import { el, number, periodPhrase } from './format.js';

/** The polygon geometry to send from an uploaded GeoJSON document: a Polygon, a MultiPolygon, or several merged. */
export function polygonOf(document_) {
  const polygons = [];
  const visit = g => {
    if (!g) return;
    if (g.type === 'Polygon') polygons.push(g.coordinates);
    else if (g.type === 'MultiPolygon') polygons.push(...g.coordinates);
    else if (g.type === 'Feature') visit(g.geometry);
    else if (g.type === 'FeatureCollection') (g.features ?? []).forEach(visit);
    else if (g.type === 'GeometryCollection') (g.geometries ?? []).forEach(visit);
  };
  visit(document_);
  if (!polygons.length) return null;
  return polygons.length === 1 ? { type: 'Polygon', coordinates: polygons[0] } : { type: 'MultiPolygon', coordinates: polygons };
}

export class AreaTool {
  constructor(atlas) {
    this.atlas = atlas;
    this.map = atlas.map;
    this.drawing = false;
    this.vertices = [];
    this.geometry = null;
    this.result = document.getElementById('area-result');
    this.drawButton = document.getElementById('area-draw');
    this.finishButton = document.getElementById('area-finish');
    this.cancelButton = document.getElementById('area-cancel');
    this.threshold = document.getElementById('area-threshold');
    this.shapes = L.layerGroup().addTo(this.map);

    this.drawButton.addEventListener('click', () => this.startDrawing());
    this.finishButton.addEventListener('click', () => this.finishDrawing());
    this.cancelButton.addEventListener('click', () => this.stopDrawing());
    document.getElementById('area-upload').addEventListener('change', e => this.upload(e.target));
    this.threshold.addEventListener('change', () => { if (this.geometry) this.compute(); });
    this.map.on('click', e => { if (this.drawing) this.addVertex(e.latlng); });
    this.map.on('dblclick', e => {
      if (!this.drawing) return;
      L.DomEvent.stop(e);
      this.finishDrawing();
    });
    document.addEventListener('keydown', e => {
      if (!this.drawing) return;
      if (e.key === 'Escape') { e.preventDefault(); this.stopDrawing(); }
      if (e.key === 'Backspace' && e.target === this.map.getContainer()) { e.preventDefault(); this.vertices.pop(); this.drawPreview(); }
    });
    const unit = document.getElementById('area-threshold-unit');
    atlas.layers.onChange(layer => {
      unit.textContent = layer.units;
      if (this.geometry) this.compute();
    });
  }

  startDrawing() {
    this.drawing = true;
    this.vertices = [];
    this.map.doubleClickZoom.disable();
    this.map.getContainer().classList.add('drawing');
    this.drawButton.setAttribute('aria-pressed', 'true');
    this.finishButton.hidden = false;
    this.cancelButton.hidden = false;
    this.finishButton.disabled = true;
    this.atlas.status('Drawing: click the corners of the area, then Finish (Escape cancels).');
    this.drawPreview();
  }

  stopDrawing() {
    this.drawing = false;
    this.map.doubleClickZoom.enable();
    this.map.getContainer().classList.remove('drawing');
    this.drawButton.setAttribute('aria-pressed', 'false');
    this.finishButton.hidden = true;
    this.cancelButton.hidden = true;
    this.atlas.status('');
    if (!this.geometry) this.shapes.clearLayers();
    else this.drawGeometry();
  }

  addVertex(latlng) {
    // A double click also fires two clicks: skip a corner repeated at the same spot.
    const last = this.vertices[this.vertices.length - 1];
    if (last && this.map.latLngToContainerPoint(last).distanceTo(this.map.latLngToContainerPoint(latlng)) < 3) return;
    this.vertices.push(L.latLng(latlng));
    this.finishButton.disabled = this.vertices.length < 3;
    this.drawPreview();
  }

  drawPreview() {
    this.shapes.clearLayers();
    if (this.vertices.length) {
      L.polygon(this.vertices, { color: '#111', weight: 2, dashArray: '4 3', fillOpacity: 0.08, interactive: false }).addTo(this.shapes);
      for (const v of this.vertices) L.circleMarker(v, { radius: 4, color: '#111', weight: 1.5, fillColor: '#fff', fillOpacity: 1, interactive: false }).addTo(this.shapes);
    }
    this.atlas.status(`Drawing: ${this.vertices.length} corner${this.vertices.length === 1 ? '' : 's'}` +
      (this.vertices.length >= 3 ? ' — Finish when done.' : ' — click at least three.'));
  }

  finishDrawing() {
    if (this.vertices.length < 3) return;
    const ring = this.vertices.map(v => [Number(v.lng.toFixed(6)), Number(v.lat.toFixed(6))]);
    ring.push(ring[0]);
    this.geometry = { type: 'Polygon', coordinates: [ring] };
    this.stopDrawing();
    this.compute();
  }

  async upload(input) {
    const file = input.files?.[0];
    if (!file) return;
    try {
      const geometry = polygonOf(JSON.parse(await file.text()));
      if (!geometry) throw new Error(`${file.name} holds no Polygon or MultiPolygon.`);
      this.geometry = geometry;
      this.drawGeometry(true);
      await this.compute();
    } catch (error) {
      this.result.classList.add('error');
      this.result.replaceChildren(`${file.name}: ${error.message}`);
    } finally {
      input.value = '';
    }
  }

  drawGeometry(zoom = false) {
    this.shapes.clearLayers();
    const shape = L.geoJSON(this.geometry, { style: { color: '#111', weight: 2, fillOpacity: 0.06 }, interactive: false }).addTo(this.shapes);
    if (zoom) this.map.fitBounds(shape.getBounds().pad(0.2));
  }

  async compute() {
    const layer = this.atlas.layers.current;
    if (!layer || !this.geometry) return;
    const threshold = this.threshold.value.trim();
    const url = `${datasetUrl(this.atlas.slug)}/area` +
      query({ parameter: layer.parameter, statistic: layer.statistic, period: layer.period, threshold });
    this.result.classList.remove('error');
    this.result.replaceChildren('Computing…');
    try {
      const a = await postJson(url, this.geometry);
      const units = a.layer.units;
      const rows = [
        ['Polygon area', `${number(a.area_km2)} km²`],
        ['Cells inside', `${a.cell_count} (${a.cells_with_value} with a value), ${number(a.cell_area_km2)} km²`],
        ['Mean', `${number(a.mean)} ${units}`],
        ['Area-weighted mean', `${number(a.area_weighted_mean)} ${units}`],
        ['Least – greatest', `${number(a.min)} – ${number(a.max)} ${units}`],
        ['p10 / p50 / p90 of cells', `${number(a.p10)} / ${number(a.p50)} / ${number(a.p90)} ${units}`],
      ];
      if (a.threshold !== null && a.threshold !== undefined)
        rows.push([`Above ${number(a.threshold)} ${units}`, `${a.cells_above_threshold} cells, ${number(a.area_above_threshold_km2)} km²`]);
      this.result.replaceChildren(
        el('p', {}, el('strong', {}, `${a.layer.parameter} ${a.layer.statistic}, ${periodPhrase(a.layer.period)}`)),
        el('dl', { class: 'facts', 'data-field': 'area-stats' }, rows.flatMap(([k, v]) => [el('dt', {}, k), el('dd', {}, v)])),
        el('details', { class: 'muted' }, el('summary', {}, 'How these are computed'), el('p', {}, a.method)));
    } catch (error) {
      this.result.classList.add('error');
      this.result.replaceChildren(error.message);
    }
  }
}
