// Finds the cell whose footprint holds a position. Footprints are binned on a coarse longitude-latitude grid by their
// bounding boxes (about one bin per cell), so a look-up tests only the few footprints of one bin, however large the
// dataset; each candidate is then tested exactly by ray casting.

/** True when (x, y) lies inside the ring (flat [lon, lat, ...], not closed); points on an edge may go either way. */
function ringContains(ring, x, y) {
  let inside = false;
  for (let k = 0, m = ring.length - 2; k < ring.length; m = k, k += 2) {
    const xk = ring[k], yk = ring[k + 1], xm = ring[m], ym = ring[m + 1];
    if ((yk > y) !== (ym > y) && x < (xm - xk) * (y - yk) / (ym - yk) + xk) inside = !inside;
  }
  return inside;
}

export class FootprintIndex {
  /** `footprints`: a Map from cell id to its ring (flat [lon, lat, ...]). */
  constructor(footprints) {
    this.size = footprints.size;
    let west = Infinity, east = -Infinity, south = Infinity, north = -Infinity;
    const boxes = [];
    for (const [id, ring] of footprints) {
      let x0 = Infinity, x1 = -Infinity, y0 = Infinity, y1 = -Infinity;
      for (let k = 0; k < ring.length; k += 2) {
        x0 = Math.min(x0, ring[k]); x1 = Math.max(x1, ring[k]); y0 = Math.min(y0, ring[k + 1]); y1 = Math.max(y1, ring[k + 1]);
      }
      boxes.push({ id, ring, x0, x1, y0, y1 });
      west = Math.min(west, x0); east = Math.max(east, x1); south = Math.min(south, y0); north = Math.max(north, y1);
    }
    this.west = west; this.south = south;
    this.columns = Math.max(1, Math.round(Math.sqrt(boxes.length)));
    this.rows = this.columns;
    // A zero span (one cell, or none) still gives a finite bin size.
    this.binWidth = (east - west) / this.columns || 1;
    this.binHeight = (north - south) / this.rows || 1;
    this.bins = new Map();
    for (const box of boxes) {
      const [c0, r0] = this.binOf(box.x0, box.y0), [c1, r1] = this.binOf(box.x1, box.y1);
      for (let r = r0; r <= r1; r++) for (let c = c0; c <= c1; c++) {
        const key = r * this.columns + c;
        if (!this.bins.has(key)) this.bins.set(key, []);
        this.bins.get(key).push(box);
      }
    }
  }

  binOf(x, y) {
    const clamp = (v, n) => Math.min(n - 1, Math.max(0, Math.floor(v)));
    return [clamp((x - this.west) / this.binWidth, this.columns), clamp((y - this.south) / this.binHeight, this.rows)];
  }

  /** The id of the cell whose footprint holds (lat, lon), or null when no footprint does. */
  cellAt(lat, lon) {
    const [c, r] = this.binOf(lon, lat);
    for (const box of this.bins.get(r * this.columns + c) ?? []) {
      if (lon < box.x0 || lon > box.x1 || lat < box.y0 || lat > box.y1) continue;
      if (ringContains(box.ring, lon, lat)) return box.id;
    }
    return null;
  }
}
