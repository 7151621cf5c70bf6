// The power rose as SVG: one wedge per direction sector (the direction the waves come from, sector 0 centred on
// north, clockwise). Wedge AREA is proportional to the sector's share of the energy flux, so the radius goes with the
// square root of the share; rings mark shares of 5, 10, 20 and 40 %.

const svgNs = 'http://www.w3.org/2000/svg';

function svg(tag, attrs = {}) {
  const node = document.createElementNS(svgNs, tag);
  for (const [k, v] of Object.entries(attrs)) node.setAttribute(k, v);
  return node;
}

function polar(cx, cy, r, degreesFromNorth) {
  const a = (degreesFromNorth - 90) * Math.PI / 180;
  return [cx + r * Math.cos(a), cy + r * Math.sin(a)];
}

/** An SVG element drawing the rose; `rose` is the API's power_rose member. */
export function powerRoseSvg(rose, colour) {
  const size = 260, c = size / 2, outer = 100;
  const fractions = rose.fractions;
  const largest = Math.max(...fractions, 1e-9);
  const rings = [0.05, 0.1, 0.2, 0.4].filter(f => f <= largest * 1.15);
  const scaleTop = Math.max(largest, rings.length ? rings[rings.length - 1] : largest);
  const radius = f => outer * Math.sqrt(Math.max(0, f) / scaleTop);

  const root = svg('svg', { viewBox: `0 0 ${size} ${size}`, width: '100%', class: 'power-rose', role: 'img' });
  const dominant = fractions.indexOf(largest);
  const title = svg('title');
  title.textContent = `Power rose: ${fractions.length} sectors; the largest share, ${(100 * largest).toFixed(1)} %, ` +
    `comes from ${rose.sector_centres_degrees[dominant]}°.`;
  root.append(title);

  for (const f of rings) {
    root.append(svg('circle', { cx: c, cy: c, r: radius(f), fill: 'none', stroke: '#8a949c', 'stroke-width': 0.8, 'stroke-dasharray': '3 3' }));
    const [x, y] = polar(c, c, radius(f), 22.5 * 1.5);
    const label = svg('text', { x: x + 2, y: y, class: 'rose-ring-label' });
    label.textContent = `${Math.round(f * 100)} %`;
    root.append(label);
  }
  for (const [name, deg] of [['N', 0], ['E', 90], ['S', 180], ['W', 270]]) {
    root.append(svg('line', { x1: c, y1: c, x2: polar(c, c, outer + 4, deg)[0], y2: polar(c, c, outer + 4, deg)[1], stroke: '#b9c0c6', 'stroke-width': 0.8 }));
    const [x, y] = polar(c, c, outer + 16, deg);
    const label = svg('text', { x, y, 'text-anchor': 'middle', 'dominant-baseline': 'central', class: 'rose-compass' });
    label.textContent = name;
    root.append(label);
  }

  const half = rose.sector_width_degrees / 2;
  fractions.forEach((f, k) => {
    if (!(f > 0)) return;
    const centre = rose.sector_centres_degrees[k];
    const r = radius(f);
    const [x1, y1] = polar(c, c, r, centre - half);
    const [x2, y2] = polar(c, c, r, centre + half);
    const wedge = svg('path', {
      d: `M ${c} ${c} L ${x1.toFixed(2)} ${y1.toFixed(2)} A ${r.toFixed(2)} ${r.toFixed(2)} 0 0 1 ${x2.toFixed(2)} ${y2.toFixed(2)} Z`,
      fill: colour, 'fill-opacity': 0.85, stroke: '#ffffff', 'stroke-width': 0.8,
    });
    const tip = svg('title');
    tip.textContent = `from ${centre}° ± ${half}°: ${(100 * f).toFixed(1)} % of the energy`;
    wedge.append(tip);
    root.append(wedge);
  });
  return root;
}
