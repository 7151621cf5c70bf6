// Number and text formatting shared by the panels. Missing values (null, NaN) show as an en dash.

export const missing = '–';

/** A number with a fixed count of significant digits for its size: 0.123, 1.23, 12.3, 123. */
export function number(value, digits = 3) {
  if (value === null || value === undefined || !Number.isFinite(value)) return missing;
  const magnitude = Math.abs(value);
  if (magnitude === 0) return '0';
  if (magnitude >= 10 ** digits) return Math.round(value).toLocaleString('en-GB');
  const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(magnitude)));
  return value.toFixed(Math.min(decimals, 6));
}

/** A number with exactly `decimals` decimals. */
export function fixed(value, decimals) {
  if (value === null || value === undefined || !Number.isFinite(value)) return missing;
  return value.toFixed(decimals);
}

export function percent(fraction, decimals = 1) {
  if (fraction === null || fraction === undefined || !Number.isFinite(fraction)) return missing;
  return (100 * fraction).toFixed(decimals) + ' %';
}

/** Latitude and longitude as signed decimal degrees with hemisphere letters. */
export function position(lat, lon) {
  const ns = lat >= 0 ? 'N' : 'S', ew = lon >= 0 ? 'E' : 'W';
  return `${Math.abs(lat).toFixed(4)}° ${ns}, ${Math.abs(lon).toFixed(4)}° ${ew}`;
}

/** An element with optional class, attributes and children (strings become text nodes). */
export function el(tag, props = {}, ...children) {
  const node = document.createElement(tag);
  for (const [k, v] of Object.entries(props)) {
    if (v === undefined || v === null || v === false) continue;
    if (k === 'class') node.className = v;
    else if (k === 'text') node.textContent = v;
    else if (k.startsWith('on')) node.addEventListener(k.slice(2), v);
    else node.setAttribute(k, v === true ? '' : v);
  }
  for (const child of children.flat()) if (child !== null && child !== undefined) node.append(child);
  return node;
}

export const periodNames = {
  jan: 'January', feb: 'February', mar: 'March', apr: 'April', may: 'May', jun: 'June', jul: 'July', aug: 'August',
  sep: 'September', oct: 'October', nov: 'November', dec: 'December',
  djf: 'Winter (Dec–Feb)', mam: 'Spring (Mar–May)', jja: 'Summer (Jun–Aug)', son: 'Autumn (Sep–Nov)', annual: 'Whole year',
};

/** A readable name of a period code (y2019 → Year 2019). */
export function periodName(code) {
  if (periodNames[code]) return periodNames[code];
  const year = /^y(\d{4})$/.exec(code);
  return year ? `Year ${year[1]}` : code;
}

/** A period as it reads inside a sentence: "whole year", "winter (Dec–Feb)", "January", "Year 2021". */
export function periodPhrase(code) {
  const name = periodName(code);
  return code === 'annual' || ['djf', 'mam', 'jja', 'son'].includes(code) ? name[0].toLowerCase() + name.slice(1) : name;
}

export const months = ['jan', 'feb', 'mar', 'apr', 'may', 'jun', 'jul', 'aug', 'sep', 'oct', 'nov', 'dec'];
