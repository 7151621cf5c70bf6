// The value read-out under the colour bar: the current layer's value of one cell, as text with its unit. The colour
// bar gives a value only roughly; the read-out gives the number itself. It follows the pointer over the map; a tap or
// click (a touch screen has no pointer to follow) reads the cell tapped; and while the map has the keyboard focus it
// reads the cell at the map centre after each move, the cell Enter would open.

import { FootprintIndex } from './footprint-index.js';
import { el } from './format.js';

const hint = 'Point at a sea cell to read its value.';

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
    this.index = null;
    this.frame = null;
    const map = atlas.map;
    const container = map.getContainer();
    // Pointer moves arrive faster than frames: read once per frame, at the latest position.
    map.on('mousemove', e => {
      this.at = { lat: e.latlng.lat, lon: e.latlng.lng, where: 'Pointer' };
      this.frame ??= requestAnimationFrame(() => { this.frame = null; this.refresh(); });
    });
    map.on('click', e => this.read({ lat: e.latlng.lat, lon: e.latlng.lng, where: 'Clicked' }));
    container.addEventListener('pointerleave', () => { if (this.at?.where === 'Pointer') this.read(null); });
    map.on('moveend', () => {
      if (document.activeElement !== container) return;
      const centre = map.getCenter();
      this.read({ lat: centre.lat, lon: centre.lng, where: 'Map centre' });
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

  /** Writes the text for the read position and the current layer; called again whenever a new layer is drawn. */
  refresh() {
    const layer = this.atlas.layers?.current;
    const id = this.at && layer ? this.cellAt(this.at) : null;
    if (id === null) {
      this.node.replaceChildren(hint);
      return;
    }
    const value = layer.values.get(id);
    const unit = layer.units && layer.units !== '1' ? ` ${layer.units}` : '';
    this.node.replaceChildren(`${this.at.where}, cell ${id}: `, Number.isFinite(value)
      ? el('strong', { 'data-field': 'cell-value' }, `${readoutValue(value, layer.statistic)}${unit}`)
      : 'no value in this layer');
  }
}
