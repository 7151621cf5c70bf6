// The value read-out under the colour bar: the current layer's value of one cell, as text with its unit. The colour
// bar gives a value only roughly; the read-out gives the number itself. It follows the pointer over the map; a tap or
// click (a touch screen has no pointer to follow) reads the cell tapped; and a move of the focused map with the keys
// reads the cell at the map centre, the cell Enter would open.

import { FootprintIndex } from './footprint-index.js';
import { el } from './format.js';

const hint = 'Point at or tap a sea cell to read its value.';

// The keys with which the map pans and zooms (the map library's keyboard handler).
const keysThatMove = new Set(['ArrowUp', 'ArrowDown', 'ArrowLeft', 'ArrowRight', '+', '-', '=', '_']);

/**
 * A layer value as the read-out shows it: four decimals, which single-precision layer values (about seven significant
 * digits) carry for every magnitude the atlas shows; a count of steps is a whole number.
 */
export function readoutValue(value, statistic) {
  return statistic === 'count' ? Math.round(value).toLocaleString('en-GB') : value.toFixed(4);
}

export class CellReadout {
  constructor(atlas) {
    this.atlas = atlas;
    this.node = el('p', { class: 'legend-readout', id: 'legend-readout', 'aria-live': 'polite' }, hint);
    this.at = null;          // { lat, lon, where }: the position read, and how it was chosen
    this.shown = hint;       // what the read-out says now
    this.index = null;
    this.frame = null;
    const map = atlas.map;
    const container = map.getContainer();
    // Pointer moves arrive faster than frames: read once per frame, at the latest position.
    map.on('mousemove', e => {
      this.at = { lat: e.latlng.lat, lon: e.latlng.lng, where: 'Under the pointer' };
      this.frame ??= requestAnimationFrame(() => { this.frame = null; this.refresh(); });
    });
    map.on('click', e => this.read({ lat: e.latlng.lat, lon: e.latlng.lng, where: 'Clicked' }));
    container.addEventListener('pointerleave', () => { if (this.at?.where === 'Under the pointer') this.read(null); });
    // Only a move made with the keys reads the centre: a click also focuses the map, and the map then moves when the
    // point panel opens beside it, which must not replace the clicked cell's reading.
    this.movedByKeys = false;
    container.addEventListener('keydown', e => { if (e.target === container && keysThatMove.has(e.key)) this.movedByKeys = true; });
    map.on('moveend', () => {
      if (!this.movedByKeys) return;
      this.movedByKeys = false;
      const centre = map.getCenter();
      this.read({ lat: centre.lat, lon: centre.lng, where: 'At the map centre' });
    });
  }

  read(at) {
    this.at = at;
    this.refresh();
  }

  /** The cell under the read position, with an index rebuilt when footprints were added (they are never removed). */
  cellAt({ lat, lon }) {
    const footprints = this.atlas.layers?.footprints;
    if (!footprints?.size) return null;
    if (this.index?.size !== footprints.size) this.index = new FootprintIndex(footprints);
    return this.index.cellAt(lat, lon);
  }

  /**
   * Writes the text for the read position and the current layer; called again whenever a new layer is drawn. The text
   * is rewritten only when it changes, so that a screen reader hears each cell once, not each pointer move.
   */
  refresh() {
    const layer = this.atlas.layers?.current;
    const id = this.at && layer ? this.cellAt(this.at) : null;
    const value = id === null ? undefined : layer.values.get(id);
    const unit = layer?.units && layer.units !== '1' ? ` ${layer.units}` : '';
    const shown = id === null ? null : Number.isFinite(value) ? `${readoutValue(value, layer.statistic)}${unit}` : '';
    const key = id === null ? hint : `${this.at.where}|${id}|${shown}`;
    if (key === this.shown) return;
    this.shown = key;
    if (id === null) this.node.replaceChildren(hint);
    else this.node.replaceChildren(`${this.at.where}, cell ${id}: `,
      shown ? el('strong', { 'data-field': 'cell-value' }, shown) : 'no value in this layer');
  }
}
