// Talks to the atlas API under /api/v1. Errors arrive as RFC 9457 problem details; they are turned into an Error
// whose message is the problem's own title and detail, so the page can show what the server said to fix.

export const apiRoot = '/api/v1';

export class ApiError extends Error {
  constructor(status, title, detail, errors) {
    super(detail ? `${title}: ${detail}` : title);
    this.status = status;
    this.title = title;
    this.detail = detail;
    this.errors = errors;
  }
}

async function failure(response) {
  let title = `${response.status} ${response.statusText}`.trim(), detail = '', errors = null;
  try {
    const problem = await response.json();
    title = problem.title || title;
    detail = problem.detail || '';
    errors = problem.errors || null;
    if (errors) detail = [detail, ...Object.entries(errors).map(([k, v]) => `${k}: ${[].concat(v).join(' ')}`)].filter(Boolean).join(' ');
  } catch { /* not a problem document: keep the status line */ }
  return new ApiError(response.status, title, detail, errors);
}

/** GET a JSON document; throws ApiError on a non-2xx answer. */
export async function getJson(url, { signal } = {}) {
  const response = await fetch(url, { signal, headers: { Accept: 'application/json' } });
  if (!response.ok) throw await failure(response);
  return response.json();
}

/** GET a text document (CSV). */
export async function getText(url, { signal } = {}) {
  const response = await fetch(url, { signal });
  if (!response.ok) throw await failure(response);
  return response.text();
}

/** GET a JSON document, or null when the server answers 404 (an endpoint or record that this server lacks). */
export async function getJsonOrNull(url, { signal } = {}) {
  const response = await fetch(url, { signal, headers: { Accept: 'application/json' } });
  if (response.status === 404 || response.status === 405) return null;
  if (!response.ok) throw await failure(response);
  return response.json();
}

/** POST a JSON body, answer JSON. */
export async function postJson(url, body, { signal } = {}) {
  const response = await fetch(url, {
    method: 'POST', signal, body: JSON.stringify(body),
    headers: { 'Content-Type': 'application/geo+json', Accept: 'application/json' },
  });
  if (!response.ok) throw await failure(response);
  return response.json();
}

/** A query string from an object, leaving out empty values. */
export function query(params) {
  const search = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v !== undefined && v !== null && v !== '') search.set(k, String(v));
  const text = search.toString();
  return text ? '?' + text : '';
}

export const datasetUrl = slug => `${apiRoot}/datasets/${encodeURIComponent(slug)}`;
export const layerUrl = (slug, parameter, statistic, period, format) =>
  `${datasetUrl(slug)}/layers/${parameter}/${statistic}/${period}.${format}`;

/**
 * Parses the layer CSV (# header lines, then cell_id,lon,lat,value) into parallel arrays.
 * Rows with an empty or non-numeric value are skipped.
 */
export function parseLayerCsv(text) {
  const ids = [], lons = [], lats = [], values = [];
  let header = false;
  for (const line of text.split(/\r?\n/)) {
    if (!line || line.startsWith('#')) continue;
    if (!header) { header = true; continue; }
    const parts = line.split(',');
    const value = Number(parts[3]);
    if (parts.length < 4 || parts[3] === '' || !Number.isFinite(value)) continue;
    ids.push(Number(parts[0]));
    lons.push(Number(parts[1]));
    lats.push(Number(parts[2]));
    values.push(value);
  }
  return { ids, lons, lats, values };
}
