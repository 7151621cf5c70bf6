// Starts the requests the first picture needs while the map library and the page's modules are still loading:
// the dataset list, then (for the dataset and layer the address names, or the defaults) the first layer with its
// cell footprints, the layer catalogue and the dataset description, and the colour scales. main.js picks these
// promises up.
(function () {
  'use strict';
  var hash = new URLSearchParams(location.hash.slice(1));
  function json(url) {
    return fetch(url, { headers: { Accept: 'application/json' } }).then(function (response) {
      return response.ok ? response.json() : Promise.reject(new Error(url + ': ' + response.status));
    });
  }
  function quiet(promise) { promise.catch(function () {}); return promise; }
  var layer = { parameter: hash.get('p') || 'j', statistic: hash.get('s') || 'mean', period: hash.get('t') || 'annual' };
  var datasets = quiet(json('/api/v1/datasets'));
  var first = quiet(datasets.then(function (list) {
    var wanted = hash.get('dataset');
    var chosen = list.datasets.filter(function (d) { return d.slug === wanted; })[0] || list.datasets[0];
    if (!chosen) return null;
    var root = '/api/v1/datasets/' + encodeURIComponent(chosen.slug);
    return {
      slug: chosen.slug,
      layer: layer,
      layerDocument: quiet(json(root + '/layers/' + layer.parameter + '/' + layer.statistic + '/' + layer.period + '.geojson?geometry=polygon')),
      catalogue: quiet(json(root + '/layers')),
      detail: quiet(json(root)),
    };
  }));
  window.atlasBoot = {
    datasets: datasets, first: first, config: quiet(json('/config.json')), openApi: quiet(json('/swagger/v1/swagger.json')),
    colourScales: quiet(json('/api/v1/colour-scales')),
  };
})();
