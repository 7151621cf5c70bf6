// The Hm0 x Te joint occurrence as an HTML table: rows are Hs bins (highest at the top, as on a chart), columns Te
// bins; each bin shows its share of time and is shaded by it. Shade goes with the square root of the share so that
// the rarer, energetic sea states stay visible next to the common ones. Empty outer rows and columns are left out.

import { sequentialScale, textColourOn } from './colour-scale.js';
import { el, fixed } from './format.js';

function shareText(fraction) {
  if (!(fraction > 0)) return '';
  const pct = 100 * fraction;
  return pct < 0.01 ? '<0.01' : pct < 10 ? pct.toFixed(2) : pct.toFixed(1);
}

/** A table element for the API's joint_occurrence member. */
export function jointOccurrenceTable(joint) {
  const counts = joint.counts;
  const rows = counts.length, cols = rows ? counts[0].length : 0;
  let r0 = rows, r1 = -1, c0 = cols, c1 = -1;
  for (let r = 0; r < rows; r++) for (let c = 0; c < cols; c++) if (counts[r][c] > 0) {
    r0 = Math.min(r0, r); r1 = Math.max(r1, r); c0 = Math.min(c0, c); c1 = Math.max(c1, c);
  }
  if (r1 < 0) return el('p', { class: 'muted', text: 'No step has both Hs and Te in this window.' });

  let largest = 0;
  for (let r = r0; r <= r1; r++) for (let c = c0; c <= c1; c++) largest = Math.max(largest, joint.fraction_of_time[r][c]);

  const hsW = joint.hs_bin_width_metres, teW = joint.te_bin_width_seconds;
  const table = el('table', { class: 'joint-table' });
  const caption = el('p', { class: 'muted', id: 'joint-caption' },
    `Share of time (%) in each Hm0 × Te bin (${fixed(hsW, 1)} m × ${fixed(teW, 1)} s; a bin holds its lower edge), ` +
    `${joint.total_count.toLocaleString('en-GB')} steps. Hover over a bin for its mean power and share of energy.`);
  const head = el('tr', {}, el('th', { scope: 'col', class: 'corner' }, 'Hs (m) \\ Te (s)'));
  for (let c = c0; c <= c1; c++) head.append(el('th', { scope: 'col' }, fixed(joint.te_bin_lower_edges[c], 0)));
  table.append(el('thead', {}, head));
  const body = el('tbody');
  for (let r = r1; r >= r0; r--) {
    const lower = joint.hs_bin_lower_edges[r];
    const tr = el('tr', {}, el('th', { scope: 'row' }, `${fixed(lower, 1)}–${fixed(lower + hsW, 1)}`));
    for (let c = c0; c <= c1; c++) {
      const f = joint.fraction_of_time[r][c];
      const td = el('td', {}, shareText(f));
      if (f > 0) {
        const rgb = sequentialScale.rgb(Math.sqrt(f / largest));
        td.style.background = `rgb(${rgb[0]} ${rgb[1]} ${rgb[2]})`;
        td.style.color = textColourOn(rgb);
        const power = joint.mean_power_kilowatts_per_metre[r][c];
        const te = joint.te_bin_lower_edges[c];
        td.title = `Hs ${fixed(lower, 1)}–${fixed(lower + hsW, 1)} m, Te ${fixed(te, 0)}–${fixed(te + teW, 0)} s: ` +
          `${counts[r][c]} steps, ${(100 * f).toFixed(3)} % of time, mean power ${fixed(power, 1)} kW/m, ` +
          `${(100 * joint.fraction_of_energy[r][c]).toFixed(2)} % of the energy`;
      }
      tr.append(td);
    }
    body.append(tr);
  }
  table.append(body);
  return el('div', {}, caption,
    el('div', { class: 'table-scroll', tabindex: '0', role: 'region', 'aria-labelledby': 'joint-caption' }, table));
}
