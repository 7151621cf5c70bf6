// Runs after the page's libraries were asked for and before the page's modules: when Leaflet (the map) or uPlot
// (the charts) did not load, as on a server where npm ci was never run in wwwroot, the modules cannot even be
// evaluated (they build on these libraries when imported), so this says what is wrong and how to mend it instead of
// leaving the page on "Loading…".
(function () {
  'use strict';
  var missing = [];
  if (typeof window.L === 'undefined') missing.push('the map library Leaflet (/node_modules/leaflet/dist/leaflet.js)');
  if (typeof window.uPlot === 'undefined') missing.push('the chart library uPlot (/node_modules/uplot/dist/uPlot.iife.min.js)');
  if (!missing.length) return;
  window.atlasLibrariesMissing = true;
  var status = document.getElementById('map-status');
  status.textContent = 'The page cannot start: ' + missing.join(' and ') + ' did not load. The page\u2019s libraries are not ' +
    'installed on this server: run bash deploy/prepare.sh (or npm ci in the wwwroot folder), then reload this page.';
  status.classList.add('error');
  document.getElementById('dataset-title').textContent = 'The page\u2019s libraries are missing.';
  // The colour bar stays empty without the map: hide its frame rather than show an empty box.
  var legend = document.getElementById('map-legend');
  if (legend) legend.hidden = true;
})();
