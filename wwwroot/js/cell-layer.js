// A Leaflet layer that paints cell footprints onto one canvas: the current statistic in colour, the land mask, the
// screening highlight. One canvas instead of thousands of vector objects keeps redraws to a few milliseconds, and a
// 2-D canvas needs no GPU.

/* global L */

/** Projects a footprint ring (flat [lon, lat, lon, lat, ...]) to container pixels. */
function projectRing(map, ring) {
  const out = new Float64Array(ring.length);
  for (let k = 0; k < ring.length; k += 2) {
    const p = map.latLngToContainerPoint([ring[k + 1], ring[k]]);
    out[k] = p.x;
    out[k + 1] = p.y;
  }
  return out;
}

function tracePath(ctx, pts) {
  ctx.moveTo(pts[0], pts[1]);
  for (let k = 2; k < pts.length; k += 2) ctx.lineTo(pts[k], pts[k + 1]);
  ctx.closePath();
}

export const CellCanvasLayer = L.Layer.extend({
  options: { pane: 'overlayPane' },

  initialize(options) {
    L.setOptions(this, options);
    this._cells = [];          // [{ id, ring }]
    this._colourOf = null;     // id -> 'rgb(...)' or null (no value)
    this._highlight = null;    // Set of ids, or null
    this._land = [];           // rings of dry cells
    this._drawCount = 0;
  },

  /** Footprints of the wet cells: [{ id, ring }]. */
  setCells(cells) { this._cells = cells; this._projected = null; this.redraw(); },

  /** Rings of the land mask (dry cells). */
  setLand(rings) { this._land = rings; this._projectedLand = null; this.redraw(); },

  /** A function from cell id to a CSS colour (or null for a cell without a value). */
  setColours(colourOf) { this._colourOf = colourOf; this.redraw(); },

  /** Cells to outline, dimming the rest; null clears. */
  setHighlight(ids) { this._highlight = ids; this.redraw(); },

  /** How many times the canvas has been painted (the page's tests read it through the canvas data attribute). */
  get drawCount() { return this._drawCount; },

  onAdd(map) {
    this._canvas = L.DomUtil.create('canvas', 'cell-canvas leaflet-zoom-animated');
    this._canvas.setAttribute('aria-hidden', 'true');
    this.getPane().appendChild(this._canvas);
    map.on('moveend resize viewreset', this._reset, this);
    if (map._zoomAnimated) map.on('zoomanim', this._animateZoom, this);
    this._reset();
  },

  onRemove(map) {
    map.off('moveend resize viewreset', this._reset, this);
    map.off('zoomanim', this._animateZoom, this);
    L.DomUtil.remove(this._canvas);
  },

  _animateZoom(e) {
    const map = this._map;
    const scale = map.getZoomScale(e.zoom);
    const offset = map._latLngBoundsToNewLayerBounds(map.getBounds(), e.zoom, e.center).min;
    L.DomUtil.setTransform(this._canvas, offset, scale);
  },

  _reset() {
    const map = this._map;
    if (!map) return;
    const size = map.getSize();
    const ratio = window.devicePixelRatio || 1;
    L.DomUtil.setPosition(this._canvas, map.containerPointToLayerPoint([0, 0]));
    this._canvas.width = Math.round(size.x * ratio);
    this._canvas.height = Math.round(size.y * ratio);
    this._canvas.style.width = size.x + 'px';
    this._canvas.style.height = size.y + 'px';
    this._projected = null;
    this._projectedLand = null;
    this._paint();
  },

  redraw() {
    if (!this._map || this._frame) return this;
    this._frame = L.Util.requestAnimFrame(() => { this._frame = null; this._paint(); });
    return this;
  },

  _landPattern(ctx) {
    if (this._pattern) return this._pattern;
    const tile = document.createElement('canvas');
    tile.width = tile.height = 8;
    const t = tile.getContext('2d');
    t.fillStyle = this.options.landColour;
    t.fillRect(0, 0, 8, 8);
    t.strokeStyle = this.options.landHatch;
    t.lineWidth = 1;
    t.beginPath();
    t.moveTo(-1, 9); t.lineTo(9, -1);
    t.moveTo(-1, 1); t.lineTo(1, -1);
    t.moveTo(7, 9); t.lineTo(9, 7);
    t.stroke();
    this._pattern = ctx.createPattern(tile, 'repeat');
    return this._pattern;
  },

  _paint() {
    const map = this._map;
    if (!map) return;
    const ctx = this._canvas.getContext('2d');
    const ratio = window.devicePixelRatio || 1;
    ctx.setTransform(ratio, 0, 0, ratio, 0, 0);
    ctx.clearRect(0, 0, this._canvas.width, this._canvas.height);
    this._projected ??= this._cells.map(c => ({ id: c.id, pts: projectRing(map, c.ring) }));
    this._projectedLand ??= this._land.map(r => projectRing(map, r));

    const highlight = this._highlight;
    const paintCell = cell => {
      const colour = this._colourOf(cell.id);
      if (!colour) return;
      ctx.beginPath();
      tracePath(ctx, cell.pts);
      ctx.fillStyle = colour;
      ctx.fill();
      // A hairline in the same colour closes the anti-aliasing gaps between neighbouring cells.
      ctx.strokeStyle = colour;
      ctx.lineWidth = 0.6;
      ctx.stroke();
    };
    if (this._colourOf) {
      for (const cell of this._projected) paintCell(cell);
      if (highlight) {
        // One pale veil over the whole sea, then the matching cells again at full colour: no seams between dimmed cells.
        let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
        for (const { pts } of this._projected) for (let k = 0; k < pts.length; k += 2) {
          x0 = Math.min(x0, pts[k]); x1 = Math.max(x1, pts[k]); y0 = Math.min(y0, pts[k + 1]); y1 = Math.max(y1, pts[k + 1]);
        }
        ctx.fillStyle = this.options.veil;
        ctx.fillRect(x0, y0, x1 - x0, y1 - y0);
        for (const cell of this._projected) if (highlight.has(cell.id)) paintCell(cell);
      }
    }

    // Land: one path, filled once (so neighbouring dry cells show no seams), hatched so that it can never be
    // mistaken for a colour of the scale, and outlined along the coast.
    if (this._projectedLand.length) {
      ctx.beginPath();
      for (const pts of this._projectedLand) tracePath(ctx, pts);
      ctx.fillStyle = this._landPattern(ctx);
      ctx.fill('nonzero');
      ctx.strokeStyle = this.options.landEdge;
      ctx.lineWidth = 1;
      ctx.stroke();
    }

    if (highlight) {
      ctx.beginPath();
      for (const cell of this._projected) if (highlight.has(cell.id)) tracePath(ctx, cell.pts);
      ctx.lineJoin = 'round';
      ctx.strokeStyle = this.options.highlightHalo;
      ctx.lineWidth = 3;
      ctx.stroke();
      ctx.strokeStyle = this.options.highlightColour;
      ctx.lineWidth = 1.5;
      ctx.stroke();
    }

    this._drawCount++;
    this._canvas.dataset.draws = String(this._drawCount);
    this.fire('painted', { count: this._drawCount });
  },
});
