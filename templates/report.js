// Midpath report: filter the tidy table and save it as CSV. No network, no storage.
(function () {
  'use strict';
  var dataElement = document.getElementById('midpath-data');
  var data = { settingColumns: [], rows: [] };
  if (dataElement) data = JSON.parse(dataElement.textContent || '{}');

  var filter = document.getElementById('metric-filter');
  var count = document.getElementById('filter-count');
  var rows = Array.prototype.slice.call(document.querySelectorAll('#tidy-table tbody tr'));

  function applyFilter() {
    var words = filter.value.toLowerCase().split(/\s+/).filter(Boolean);
    var shown = 0;
    rows.forEach(function (row) {
      var text = row.getAttribute('data-search') || '';
      var keep = words.every(function (word) { return text.indexOf(word) >= 0; });
      row.hidden = !keep;
      if (keep) shown += 1;
    });
    count.textContent = shown + ' of ' + rows.length + ' rows';
  }
  if (filter && count) {
    filter.addEventListener('input', applyFilter);
    applyFilter();
  }

  // RFC 4180 quoting, as `midpath table --format csv` does.
  function quote(value) {
    var text = value === null || value === undefined ? '' : String(value);
    return /[",\r\n]/.test(text) ? '"' + text.replace(/"/g, '""') + '"' : text;
  }
  function toCsv() {
    var fixed = ['method', 'suite', 'metric', 'source', 'level', 'unit', 'n', 'mean', 'std', 'ci_low', 'ci_high'];
    var lines = [data.settingColumns.concat(fixed).map(quote).join(',')];
    data.rows.forEach(function (row) {
      var cells = data.settingColumns.map(function (c) { return row.setting[c]; });
      fixed.forEach(function (c) { cells.push(row[c]); });
      lines.push(cells.map(quote).join(','));
    });
    return lines.join('\r\n') + '\r\n';
  }
  var button = document.getElementById('csv-download');
  if (button) {
    button.addEventListener('click', function () {
      var link = document.createElement('a');
      link.href = URL.createObjectURL(new Blob([toCsv()], { type: 'text/csv' }));
      link.download = 'midpath-metrics.csv';
      document.body.appendChild(link);
      link.click();
      link.remove();
    });
  }
})();
