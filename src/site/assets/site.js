// concordat site: search over the prefix files in search/ and copy buttons. Everything else works without scripts.
'use strict';
(function () {
  // Copy buttons: shown only when the clipboard can be written.
  document.querySelectorAll('button.copy').forEach(function (b) {
    if (!navigator.clipboard) return;
    b.hidden = false;
    b.addEventListener('click', function () {
      var el = document.getElementById(b.getAttribute('data-copy'));
      if (!el) return;
      navigator.clipboard.writeText(el.textContent).then(
        function () {
          b.textContent = 'Copied';
        },
        function () {
          b.textContent = 'Copy failed: select the text';
        },
      );
    });
  });

  var form = document.getElementById('search');
  if (!form) return;
  var status = document.getElementById('search-status');
  var list = document.getElementById('results');
  status.textContent = 'Type a record number or words of a title (two letters or more).';
  // The same normalisation as the index (src/site/search.ts tokens()).
  function words(s) {
    return s
      .normalize('NFKD')
      .replace(/\p{M}/gu, '')
      .toLowerCase()
      .split(/[^\p{L}\p{N}]+/u)
      .filter(function (t) {
        return t.length >= 2;
      });
  }
  function shard(t) {
    return t.slice(0, 2).replace(/[^a-z0-9]/g, '_');
  }
  var cache = {};
  var prefixes = null;
  function load(key) {
    if (!prefixes)
      prefixes = fetch(form.getAttribute('data-index') + 'prefixes.json').then(
        function (r) {
          return r.ok ? r.json() : [];
        },
        function () {
          return [];
        },
      );
    return prefixes.then(function (keys) {
      return keys.indexOf(key) < 0 ? {} : shardFile(key);
    });
  }
  function shardFile(key) {
    if (!cache[key])
      cache[key] = fetch(form.getAttribute('data-index') + key + '.json').then(
        function (r) {
          return r.ok ? r.json() : {};
        },
        function () {
          return {};
        },
      );
    return cache[key];
  }
  function hits(word) {
    return load(shard(word)).then(function (idx) {
      var out = new Map();
      Object.keys(idx).forEach(function (t) {
        if (t.indexOf(word) !== 0) return;
        idx[t].r.forEach(function (r) {
          out.set(r.join('\u0000'), r);
        });
      });
      return out;
    });
  }
  form.addEventListener('submit', function (e) {
    e.preventDefault();
    var ws = words(document.getElementById('q').value);
    list.textContent = '';
    if (!ws.length) {
      status.textContent = 'Type two letters or more.';
      return;
    }
    status.textContent = 'Searching…';
    Promise.all(ws.map(hits)).then(function (sets) {
      var first = sets[0];
      var found = [];
      first.forEach(function (r, k) {
        if (
          sets.every(function (s) {
            return s.has(k);
          })
        )
          found.push(r);
      });
      found.sort(function (a, b) {
        return a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0;
      });
      found.slice(0, 100).forEach(function (r) {
        var li = document.createElement('li');
        var a = document.createElement('a');
        a.href = r[3];
        var id = document.createElement('bdi');
        id.textContent = r[0];
        id.className = 'recid';
        a.appendChild(id);
        li.appendChild(a);
        if (r[1]) {
          var t = document.createElement('bdi');
          t.textContent = r[1];
          li.appendChild(document.createTextNode(' “'));
          li.appendChild(t);
          li.appendChild(document.createTextNode('”'));
        }
        li.appendChild(document.createTextNode(' — ' + r[2]));
        list.appendChild(li);
      });
      status.textContent = found.length
        ? found.length +
          ' record' +
          (found.length === 1 ? '' : 's') +
          ' found' +
          (found.length > 100 ? ', the first 100 shown' : '') +
          '.'
        : 'No record found.';
    });
  });
})();
