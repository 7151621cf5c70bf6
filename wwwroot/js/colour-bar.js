// The colour bar under the map: the layer's title and unit, the gradient, round tick values, and keys for land,
// the screening outline and the dataset extent, then the value read-out of one cell (kept across redraws).

import { el, number } from './format.js';

/** Round tick values covering [min, max] (1, 2, 2.5 or 5 times a power of ten apart). */
export function niceTicks(min, max, wanted = 5) {
  if (!(max > min)) return [min];
  const raw = (max - min) / wanted;
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map(m => m * power).find(s => s >= raw) ?? 10 * power;
  const ticks = [];
  for (let v = Math.ceil(min / step - 1e-9) * step; v <= max + step * 1e-9; v += step) ticks.push(Number(v.toPrecision(12)));
  return ticks;
}

/** A range [lo, hi] widened to round numbers, so the bar's ends are readable. */
export function niceRange(min, max) {
  if (!Number.isFinite(min) || !Number.isFinite(max)) return [0, 1];
  if (max === min) return min === 0 ? [0, 1] : [min - Math.abs(min) * 0.05, max + Math.abs(max) * 0.05];
  const ticks = niceTicks(min, max, 5);
  const step = ticks.length > 1 ? ticks[1] - ticks[0] : (max - min);
  return [Math.floor(min / step + 1e-9) * step, Math.ceil(max / step - 1e-9) * step].map(v => Number(v.toPrecision(12)));
}

/** Fills `container` with the bar for `scale` over [lo, hi]. */
export function drawColourBar(container, { title, units, scale, lo, hi, cyclic, highlight, land, outputPoints, readout }) {
  const ticks = cyclic ? [0, 90, 180, 270, 360] : niceTicks(lo, hi, 5);
  const tickRow = el('div', { class: 'legend-ticks', 'aria-hidden': 'true' });
  for (const t of ticks) {
    const at = (t - lo) / (hi - lo);
    if (at < -1e-9 || at > 1 + 1e-9) continue;
    const label = cyclic ? ['N', 'E', 'S', 'W', 'N'][Math.round(t / 90)] + ` ${t}°` : number(t, 3);
    const span = el('span', {}, label);
    span.style.left = `${(100 * at).toFixed(2)}%`;
    if (at < 0.02) span.style.transform = 'translateX(0)';
    if (at > 0.98) span.style.transform = 'translateX(-100%)';
    tickRow.append(span);
  }
  const bar = el('div', { class: 'legend-bar', role: 'img',
    'aria-label': `Colour scale from ${number(lo, 3)} to ${number(hi, 3)} ${units}` });
  bar.style.background = scale.gradient();
  const keys = el('ul', { class: 'legend-keys' });
  if (land) keys.append(el('li', {}, el('span', { class: 'swatch land' }), 'land (dry cells)'));
  keys.append(el('li', {}, el('span', { class: 'swatch extent' }), 'dataset extent'));
  if (outputPoints) keys.append(el('li', {}, el('span', { class: 'swatch output-point' }), 'output point (exact spectral values)'));
  if (highlight) keys.append(el('li', {}, el('span', { class: 'swatch outline' }), 'meets the screening criteria'));
  container.replaceChildren(
    el('p', { class: 'legend-title', id: 'legend-title' }, `${title} (${units})`),
    bar, tickRow, keys, ...(readout ? [readout] : []));
}
