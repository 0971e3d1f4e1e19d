// galebench live console. Talks to the server over one WebSocket (/ws); protocol in
// dashboard/README.md. Plots hold min/max pairs per bucket and draw them as a band, so a
// single-exchange spike stays visible after server-side decimation.
(function () {
  'use strict';

  // Plot panels: which signals, how to scale them for display, and their colours.
  var PANELS = [
    { id: 'dc', title: 'DC link voltage', unit: 'V', signals: [['v_dc_v', 'V dc', 1, '#0f766e']] },
    { id: 'cur', title: 'Converter currents, dq', unit: 'kA', signals: [
      ['i_grid_d_a', 'grid d', 1e-3, '#2563eb'], ['i_grid_q_a', 'grid q', 1e-3, '#db2777'],
      ['i_stator_d_a', 'gen d', 1e-3, '#65a30d'], ['i_stator_q_a', 'gen q', 1e-3, '#ea580c']] },
    { id: 'pq', title: 'Power at the terminal', unit: 'MW, Mvar', signals: [
      ['p_grid_w', 'P', 1e-6, '#7c3aed'], ['q_grid_var', 'Q', 1e-6, '#0891b2']] },
    { id: 'grid', title: 'Grid voltage', unit: 'pu', signals: [
      ['v_term_pu', 'terminal', 1, '#1d4ed8'], ['v_source_pu', 'source', 1, '#94a3b8'],
      ['v_dev_ref_pu', '\u0394V ref', 1, '#d97706']] },
    { id: 'wind', title: 'Wind and rotor', unit: 'm/s, rad/s', signals: [
      ['wind_m_s', 'wind', 1, '#0284c7'], ['rotor_speed_rad_s', 'rotor', 1, '#b45309']] },
    { id: 'late', title: 'Loop lateness and round trip', unit: '\u00b5s', signals: [
      ['lateness_us', 'lateness', 1, '#dc2626'], ['rtt_us', 'round trip', 1, '#475569']] }
  ];

  var $ = function (id) { return document.getElementById(id); };
  var state = {
    ws: null, token: null, role: null, tokenRequired: false, epoch: null,
    stream: null, lastSeq: 0, signalIndex: {}, everOpened: false, failures: 0,
    windowS: 20, nextId: 1, interactive: false, running: false, redrawPending: false
  };
  var panels = [];

  // ---------- token ----------
  (function initToken() {
    var q = new URLSearchParams(location.search);
    var t = q.get('token');
    if (t) { sessionStorage.setItem('galebench.token', t); }
    state.token = sessionStorage.getItem('galebench.token');
  })();

  // ---------- plots ----------
  function buildPanels() {
    var grid = $('plot-grid');
    PANELS.forEach(function (def) {
      var card = document.createElement('section');
      card.className = 'card plot-card empty';
      card.id = 'plot-' + def.id;
      card.innerHTML = '<header><h3></h3><span class="unit"></span></header><div class="legend"></div><div class="plot"></div>';
      card.querySelector('h3').textContent = def.title;
      card.querySelector('.unit').textContent = def.unit;
      grid.appendChild(card);
      panels.push({ def: def, card: card, plot: null, cols: [], data: null, legend: card.querySelector('.legend') });
    });
    new ResizeObserver(function () {
      panels.forEach(function (p) { if (p.plot) { p.plot.setSize(size(p)); } });
    }).observe(grid);
  }

  // y-axis width follows its longest tick label, so large values (lateness in a bad run) are not cut
  function axisWidth(u, values) {
    var longest = 0;
    (values || []).forEach(function (v) { longest = Math.max(longest, String(v).length); });
    return Math.max(40, 14 + 7 * longest);
  }

  function size(p) {
    var w = Math.max(200, p.card.clientWidth - 24);
    return { width: w, height: 190 };
  }

  // A new stream: rebuild every panel for the signals it carries.
  function onLayout(m) {
    state.stream = m.stream;
    state.lastSeq = 0;
    state.signalIndex = {};
    m.signals.forEach(function (s, i) { state.signalIndex[s.name] = i; });
    $('stream-info').textContent = 'bucket ' + fmt(m.bucketS * 1000, 0) + ' ms';
    panels.forEach(function (p) {
      if (p.plot) { p.plot.destroy(); p.plot = null; }
      p.cols = p.def.signals.filter(function (s) { return s[0] in state.signalIndex; });
      p.card.classList.toggle('empty', p.cols.length === 0);
      p.legend.innerHTML = '';
      p.values = [];
      if (p.cols.length === 0) { return; }
      p.cols.forEach(function (s) {
        var span = document.createElement('span');
        span.innerHTML = '<i></i><em></em> <b>\u2013</b>';
        span.querySelector('i').style.background = s[3];
        span.querySelector('em').textContent = s[1];
        span.querySelector('em').style.fontStyle = 'normal';
        p.legend.appendChild(span);
        p.values.push(span.querySelector('b'));
      });
      var series = [{ label: 't' }];
      var bands = [];
      p.cols.forEach(function (s, k) {
        series.push({ label: s[1] + ' min', stroke: s[3], width: 1, points: { show: false } });
        series.push({ label: s[1] + ' max', stroke: s[3], width: 1, points: { show: false } });
        bands.push({ series: [2 * k + 2, 2 * k + 1], fill: s[3] + '40' });
      });
      p.data = [[]];
      for (var k = 0; k < p.cols.length * 2; k++) { p.data.push([]); }
      var opts = Object.assign(size(p), {
        legend: { show: false },
        cursor: { drag: { x: false, y: false } },
        scales: { x: { time: false } },
        axes: [
          { stroke: '#6b7785', grid: { stroke: '#eef1f4' }, ticks: { stroke: '#dde3ea' }, label: 'plant time, s', labelSize: 18, labelFont: '11px system-ui' },
          { stroke: '#6b7785', grid: { stroke: '#eef1f4' }, ticks: { stroke: '#dde3ea' }, size: axisWidth }
        ],
        series: series,
        bands: bands
      });
      p.plot = new uPlot(opts, p.data, p.card.querySelector('.plot'));
    });
  }

  function onData(m) {
    if (m.stream !== state.stream) { return; }
    state.lastSeq = m.seq;
    var n = m.t.length;
    panels.forEach(function (p) {
      if (!p.plot) { return; }
      var d = p.data;
      for (var b = 0; b < n; b++) { d[0].push(m.t[b]); }
      p.cols.forEach(function (s, k) {
        var i = state.signalIndex[s[0]];
        var lo = m.min[i], hi = m.max[i], f = s[2];
        for (var b = 0; b < n; b++) {
          d[2 * k + 1].push(lo[b] == null ? null : lo[b] * f);
          d[2 * k + 2].push(hi[b] == null ? null : hi[b] * f);
        }
        var last = hi[n - 1];
        p.values[k].textContent = last == null ? '\u2013' : fmt(((lo[n - 1] + last) / 2) * f, 3);
      });
      // keep the chosen window of plant time
      var tEnd = d[0][d[0].length - 1];
      var cut = 0;
      while (cut < d[0].length && d[0][cut] < tEnd - state.windowS) { cut++; }
      if (cut > 0) { for (var c = 0; c < d.length; c++) { d[c].splice(0, cut); } }
    });
    scheduleRedraw();
  }

  // Redraw at most every REDRAW_MS and only when the tab is visible: drawing six plots is the
  // page's main cost, and a browser on the bench PC shares its CPU with the real-time loop.
  var REDRAW_MS = 200;
  var lastRedraw = 0;
  function scheduleRedraw() {
    if (state.redrawPending) { return; }
    state.redrawPending = true;
    var wait = Math.max(0, REDRAW_MS - (Date.now() - lastRedraw));
    setTimeout(function () {
      requestAnimationFrame(function () {
        state.redrawPending = false;
        lastRedraw = Date.now();
        panels.forEach(function (p) { if (p.plot) { p.plot.setData(p.data); } });
      });
    }, wait);
  }

  // ---------- timing and link ----------
  function onTiming(m) {
    var hist = $('lateness-hist'), axis = $('lateness-axis');
    hist.innerHTML = ''; axis.innerHTML = '';
    var kv = [];
    if (m.lateness) {
      var bins = m.lateness.bins || [];
      var max = 1;
      bins.forEach(function (b) { max = Math.max(max, b.count); });
      bins.forEach(function (b) {
        var bar = document.createElement('div');
        // log height so rare late ticks stay visible beside the main peak
        var h = b.count > 0 ? 8 + 92 * Math.log(1 + b.count) / Math.log(1 + max) : 0;
        bar.style.height = h + '%';
        if (b.count === 0) { bar.className = 'zero'; }
        bar.title = (b.upToUs == null ? 'above' : '\u2264 ' + b.upToUs + ' \u00b5s') + ': ' + b.count;
        hist.appendChild(bar);
        var lab = document.createElement('span');
        lab.textContent = b.upToUs == null ? '>' : (b.upToUs >= 1000 ? (b.upToUs / 1000) + 'k' : b.upToUs);
        axis.appendChild(lab);
      });
      kv.push(['lateness p50', us(m.lateness.p50Us)], ['lateness p99', us(m.lateness.p99Us)],
        ['lateness p99.9', us(m.lateness.p999Us)], ['lateness max', us(m.lateness.maxUs)]);
    }
    if (m.roundTrip) {
      kv.push(['round trip p50', us(m.roundTrip.p50Us)], ['round trip p99', us(m.roundTrip.p99Us)],
        ['round trip max', us(m.roundTrip.maxUs)]);
    }
    if (m.overruns != null) { kv.push(['overruns', m.overruns, m.overruns > 0]); }
    if (m.samplesDropped != null) { kv.push(['samples dropped', m.samplesDropped, m.samplesDropped > 0]); }
    if (m.samplesMissed != null) { kv.push(['console missed', m.samplesMissed, m.samplesMissed > 0]); }
    kv.push(['exchanges seen', m.samples]);
    fillKv($('timing-kv'), kv);
    if (m.link) {
      var L = m.link;
      fillKv($('link-kv'), [
        ['frames sent', L.framesSent], ['replies accepted', L.repliesAccepted],
        ['missing replies', L.missingReplies, L.missingReplies > 0], ['late replies', L.lateReplies, L.lateReplies > 0],
        ['stale replies', L.staleReplies, L.staleReplies > 0], ['duplicates', L.duplicateReplies, L.duplicateReplies > 0],
        ['CRC errors', L.crcErrors, L.crcErrors > 0], ['malformed', L.malformedFrames, L.malformedFrames > 0],
        ['invalid references', L.invalidReferences, L.invalidReferences > 0],
        ['send failures', L.sendFailures, L.sendFailures > 0], ['watchdog trips', L.watchdogTrips, L.watchdogTrips > 0]]);
    }
  }

  function fillKv(dl, rows) {
    dl.innerHTML = '';
    rows.forEach(function (r) {
      var dt = document.createElement('dt'); dt.textContent = r[0];
      var dd = document.createElement('dd'); dd.textContent = r[1] == null ? '\u2013' : r[1];
      if (r[2]) { dd.className = 'bad'; }
      dl.appendChild(dt); dl.appendChild(dd);
    });
  }

  // ---------- sequences, run, verdicts, log ----------
  function onSequences(m) {
    var ul = $('seq-list');
    ul.innerHTML = '';
    if (!m.sequences.length) { ul.innerHTML = '<li class="muted">none offered</li>'; return; }
    m.sequences.forEach(function (s) {
      var li = document.createElement('li');
      var text = document.createElement('div');
      text.innerHTML = '<div class="seq-name"></div><div class="seq-desc"></div>';
      text.querySelector('.seq-name').textContent = s.name;
      li.title = s.description || '';
      li.dataset.sequence = s.name;
      text.querySelector('.seq-desc').textContent = (s.description || '') +
        (s.durationS != null ? (s.description ? ' \u00b7 ' : '') + fmt(s.durationS, 1) + ' s' : '');
      var b = document.createElement('button');
      b.type = 'button'; b.textContent = 'Start'; b.dataset.sequence = s.name;
      b.addEventListener('click', function () { control({ action: 'start', sequence: s.name }); });
      li.appendChild(text); li.appendChild(b);
      ul.appendChild(li);
    });
    applyPermissions();
  }

  function onRun(m) {
    var pill = $('run-state');
    pill.textContent = m.state; pill.dataset.state = m.state;
    $('run-sequence').textContent = m.sequence || '';
    state.running = m.state === 'running';
    document.querySelectorAll('#seq-list li[data-sequence]').forEach(function (li) {
      li.classList.toggle('current', state.running && li.dataset.sequence === m.sequence);
    });
    var a = $('report-link');
    if (m.report) {
      a.href = m.report + (state.token ? '?token=' + encodeURIComponent(state.token) : '');
      a.hidden = false;
    } else { a.hidden = true; }
    if (m.state === 'running') {
      var ul = $('verdicts');
      ul.innerHTML = '';
      (m.checks || []).forEach(function (name) {
        var li = document.createElement('li');
        li.dataset.check = name; li.dataset.pending = 'true';
        li.innerHTML = '<div class="v-head"><span class="v-name"></span><span class="v-mark">PENDING</span></div>';
        li.querySelector('.v-name').textContent = name;
        ul.appendChild(li);
      });
      if (!ul.children.length) { ul.innerHTML = '<li class="muted">no checks yet</li>'; }
      tally();
    }
    applyPermissions();
  }

  function onVerdict(m) {
    var ul = $('verdicts');
    var placeholder = ul.querySelector('.muted');
    if (placeholder) { placeholder.remove(); }
    var li = null;
    // a check's entry is pending, or holds its verdict from when its window passed: replace it
    ul.querySelectorAll('li[data-check]').forEach(function (p) { if (!li && p.dataset.check === m.name) { li = p; } });
    if (li) { delete li.dataset.pending; } else { li = document.createElement('li'); ul.appendChild(li); }
    li.dataset.passed = String(m.passed);
    li.dataset.check = m.name;
    li.innerHTML = '<div class="v-head"><span class="v-name"></span><span class="v-mark"></span></div><div class="v-body"></div>';
    li.querySelector('.v-name').textContent = m.name;
    li.querySelector('.v-mark').textContent = m.passed ? 'PASS' : 'FAIL';
    li.querySelector('.v-body').textContent = m.measured + ' (required ' + m.required + ')' +
      (m.tS != null ? ' \u00b7 window to ' + fmt(m.tS, 2) + ' s' : '') + (m.passed ? '' : ' \u2014 ' + m.message);
    tally();
  }

  function tally() {
    var items = $('verdicts').querySelectorAll('li[data-passed]');
    var pass = 0;
    items.forEach(function (li) { if (li.dataset.passed === 'true') { pass++; } });
    $('verdict-tally').textContent = items.length ? pass + ' / ' + items.length + ' passed' : '';
  }

  function onLog(m) {
    var li = document.createElement('li');
    if (!m.accepted) { li.className = 'refused'; }
    li.innerHTML = '<span class="at"></span><span class="txt"></span>';
    li.querySelector('.at').textContent = m.at.substring(11, 19);
    li.querySelector('.txt').textContent = m.text;
    var ol = $('log');
    ol.insertBefore(li, ol.firstChild);
    while (ol.children.length > 200) { ol.removeChild(ol.lastChild); }
  }

  function onControls(m) {
    state.interactive = m.interactive;
    $('bench-card').hidden = !m.interactive;
    var sel = $('fault-kind');
    sel.innerHTML = '';
    (m.linkFaults || []).forEach(function (f) {
      var o = document.createElement('option'); o.value = f; o.textContent = f; sel.appendChild(o);
    });
    applyPermissions();
  }

  function applyPermissions() {
    var canControl = state.role === 'control' && state.ws && state.ws.readyState === 1;
    document.querySelectorAll('#seq-list button').forEach(function (b) { b.disabled = !canControl || state.running; });
    $('abort').disabled = !canControl || !state.running;
    document.querySelectorAll('#bench-card button').forEach(function (b) { b.disabled = !canControl; });
  }

  // ---------- controls ----------
  function control(msg) {
    if (!state.ws || state.ws.readyState !== 1) { toast('not connected', true); return; }
    msg.type = 'control';
    msg.id = state.nextId++;
    if (state.token) { msg.token = state.token; }
    state.ws.send(JSON.stringify(msg));
  }

  function num(id) { return parseFloat($(id).value); }

  function wireControls() {
    $('abort').addEventListener('click', function () { control({ action: 'abort' }); });
    $('wind-form').addEventListener('submit', function (e) {
      e.preventDefault(); control({ action: 'wind', windMPerS: num('wind-value') });
    });
    $('voltage-form').addEventListener('submit', function (e) {
      e.preventDefault(); control({ action: 'voltage', levelPu: num('voltage-level'), durationS: num('voltage-duration') });
    });
    $('vdev-form').addEventListener('submit', function (e) {
      e.preventDefault(); control({ action: 'vdevref', referencePu: num('vdev-value') });
    });
    $('fault-form').addEventListener('submit', function (e) {
      e.preventDefault(); control({ action: 'linkfault', fault: $('fault-kind').value, durationS: num('fault-duration') });
    });
    $('window-s').addEventListener('change', function () { state.windowS = parseFloat(this.value); });
    $('token-form').addEventListener('submit', function (e) {
      e.preventDefault();
      state.token = $('token-input').value.trim();
      sessionStorage.setItem('galebench.token', state.token);
      $('token-bar').hidden = true;
      state.failures = 0;
      connect();
    });
  }

  // ---------- connection ----------
  function connect() {
    var q = new URLSearchParams();
    if (state.token) { q.set('token', state.token); }
    if (state.stream) { q.set('stream', state.stream); q.set('after', String(state.lastSeq)); }
    var url = (location.protocol === 'https:' ? 'wss://' : 'ws://') + location.host + '/ws?' + q.toString();
    var ws = new WebSocket(url);
    state.ws = ws;
    setConn('connecting', 'connecting');
    var opened = false;
    ws.onopen = function () { opened = true; state.everOpened = true; state.failures = 0; setConn('live', 'live'); };
    ws.onmessage = function (ev) { dispatch(JSON.parse(ev.data)); };
    ws.onclose = function () {
      if (state.ws !== ws) { return; }
      state.failures++;
      applyPermissions();
      if (!opened && state.failures >= 2 && !state.everOpened) {
        // never got in: most likely a token is needed (the browser hides the 401)
        $('token-bar').hidden = false;
        setConn('down', 'refused');
        return;
      }
      var delay = Math.min(5000, 300 * Math.pow(2, Math.min(state.failures, 5)));
      setConn('down', 'reconnecting');
      setTimeout(connect, delay);
    };
  }

  function dispatch(m) {
    switch (m.type) {
      case 'hello':
        if (state.epoch && state.epoch !== m.epoch) { state.stream = null; }
        state.epoch = m.epoch; state.role = m.role; state.tokenRequired = m.tokenRequired;
        // the server re-sends run state, verdicts and log on every join: start those lists afresh
        $('verdicts').innerHTML = '<li class="muted">no checks yet</li>'; $('log').innerHTML = ''; tally();
        var r = $('role'); r.hidden = false; r.textContent = m.role === 'control' ? 'control' : 'read-only';
        applyPermissions();
        break;
      case 'controls': onControls(m); break;
      case 'sequences': onSequences(m); break;
      case 'layout': onLayout(m); break;
      case 'data': onData(m); break;
      case 'timing': onTiming(m); break;
      case 'run': onRun(m); break;
      case 'verdict': onVerdict(m); break;
      case 'log': onLog(m); break;
      case 'ack': toast(m.message, !m.accepted); break;
      case 'streamEnd': break;
      default: break;
    }
  }

  function setConn(s, text) { $('conn-dot').dataset.state = s; $('conn-text').textContent = text; }

  var toastTimer = null;
  function toast(text, refused) {
    var t = $('toast');
    t.textContent = text; t.className = 'toast' + (refused ? ' refused' : ''); t.hidden = false;
    clearTimeout(toastTimer);
    toastTimer = setTimeout(function () { t.hidden = true; }, 3500);
  }

  function fmt(x, digits) {
    if (x == null || !isFinite(x)) { return '\u2013'; }
    var a = Math.abs(x);
    if (a !== 0 && (a >= 1e5 || a < 1e-3)) { return x.toExponential(2); }
    return x.toFixed(a >= 100 ? 1 : digits);
  }
  function us(x) { return x == null ? '\u2013' : fmt(x, 1) + ' \u00b5s'; }

  buildPanels();
  wireControls();
  connect();
})();
