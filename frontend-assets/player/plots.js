// Plots beside the canvas, drawn by uPlot, with a cursor line at the player's current time.
// Clicking a plot moves the player there. A second run, when compared, is drawn dashed.

const INK = '#1d2630';
const STOP = '#8f3b00';
const A = ['#0072B2', '#D55E00', '#009E73'];
const B = ['#56B4E9', '#E69F00', '#CC79A7'];

function cursorLine(state) {
  return {
    hooks: {
      draw: [(u) => {
        const c = u.ctx;
        const stop = state.endTime ? state.endTime() : NaN;
        if (Number.isFinite(stop)) {
          // where the trial stopped early: dashed, thick and labelled, so it never reads as the cursor
          const xs = Math.round(u.valToPos(stop, 'x', true));
          const px = window.devicePixelRatio || 1;
          c.save();
          c.strokeStyle = STOP;
          c.fillStyle = STOP;
          c.lineWidth = 2.5 * px;
          c.setLineDash([5 * px, 3 * px]);
          c.beginPath();
          c.moveTo(xs, u.bbox.top);
          c.lineTo(xs, u.bbox.top + u.bbox.height);
          c.stroke();
          c.font = `${Math.round(10 * px)}px system-ui, sans-serif`;
          c.textAlign = 'right';
          c.fillText('stopped', xs - 3 * px, u.bbox.top + 11 * px);
          c.restore();
        }
        const t = state.time();
        if (!Number.isFinite(t)) return;
        const x = Math.round(u.valToPos(t, 'x', true));
        c.save();
        c.strokeStyle = INK;
        c.lineWidth = 1.5 * (window.devicePixelRatio || 1);
        c.beginPath();
        c.moveTo(x, u.bbox.top);
        c.lineTo(x, u.bbox.top + u.bbox.height);
        c.stroke();
        c.restore();
      }],
    },
  };
}

const ROWS = 30;

function num(v, digits = 3) {
  return Number.isFinite(v) ? String(Number(v.toFixed(digits))) : 'n/a';
}

/** A plot's name for screen readers: its title and each series' range. */
function summary(title, time, shown) {
  const parts = shown.map((s) => {
    let lo = Infinity;
    let hi = -Infinity;
    for (const x of s.values) {
      if (Number.isFinite(x)) {
        lo = Math.min(lo, x);
        hi = Math.max(hi, x);
      }
    }
    return lo <= hi ? `${s.label} from ${num(lo)} to ${num(hi)}` : `${s.label} no values`;
  });
  const t1 = time.length ? time[time.length - 1] : 0;
  return `Plot of ${title} over ${num(t1, 1)} s: ${parts.join('; ')}. The data is in the table below the plot.`;
}

/** The plotted series as a table, sampled to about thirty rows, in a details element. */
function dataTable(title, time, shown) {
  const details = document.createElement('details');
  details.className = 'plot-data';
  const sum = document.createElement('summary');
  const step = Math.max(1, Math.ceil(time.length / ROWS));
  sum.textContent = step > 1 ? `Data: ${title}, every ${step}th frame` : `Data: ${title}`;
  const table = document.createElement('table');
  table.className = 'grid';
  const head = document.createElement('tr');
  for (const h of ['time (s)', ...shown.map((s) => s.label)]) {
    const th = document.createElement('th');
    th.scope = 'col';
    th.textContent = h;
    head.append(th);
  }
  const thead = document.createElement('thead');
  thead.append(head);
  const body = document.createElement('tbody');
  for (let i = 0; i < time.length; i += step) {
    const tr = document.createElement('tr');
    const th = document.createElement('th');
    th.scope = 'row';
    th.textContent = num(time[i], 2);
    tr.append(th);
    for (const s of shown) {
      const td = document.createElement('td');
      td.textContent = num(s.values[i]);
      tr.append(td);
    }
    body.append(tr);
  }
  table.append(thead, body);
  details.append(sum, table);
  return details;
}

function pick(series, key) {
  return series && Array.isArray(series[key]) ? series[key] : null;
}

/**
 * Builds the plots. Only runs with a stored series (one-seed runs) get plots; the others say so.
 *
 * @param uPlot the uPlot constructor
 * @param runs [{label, series}] one or two
 * @param state {time(): seconds, endTime(): seconds of an early end or NaN, seek(seconds)}
 */
export function buildPlots(uPlot, runs, state) {
  const base = runs[0];
  const plots = [];
  const holders = {
    error: document.getElementById('plot-error'),
    ess: document.getElementById('plot-ess'),
    likelihood: document.getElementById('plot-likelihood'),
    injected: document.getElementById('plot-injected'),
  };
  if (!base.series || !Array.isArray(base.series.time)) {
    for (const h of Object.values(holders)) {
      h.textContent = 'No per-frame figures were stored for this run (runs of one seed have them).';
    }
    return { redraw() {} };
  }
  const time = base.series.time;
  const width = Math.max(260, holders.error.clientWidth || 320);
  const other = runs[1] && runs[1].series && runs[1].series.time ? runs[1] : null;
  // the compared run shares the seed and scan rate, so its frames line up with the base's times
  const aligned = (key) => {
    const v = pick(other && other.series, key);
    return v ? time.map((_, i) => (i < v.length ? v[i] : null)) : null;
  };
  const make = (holder, title, series, scales) => {
    const data = [time];
    const defs = [{}];
    for (const s of series) {
      if (!s.values) continue;
      data.push(s.values);
      defs.push({ label: s.label, stroke: s.colour, width: 1.5, dash: s.dash, scale: s.scale || 'y', points: { show: false } });
    }
    const opts = {
      title,
      width,
      height: 120,
      scales: Object.assign({ x: { time: false } }, scales || {}),
      axes: [
        { stroke: INK, size: 30 },
        { stroke: INK, size: 48 },
      ].concat(series.some((s) => s.scale === 'r') ? [{ scale: 'r', side: 1, stroke: INK, size: 44, grid: { show: false } }] : []),
      series: defs,
      legend: { live: false },
      cursor: { drag: { x: false, y: false } },
      plugins: [cursorLine(state)],
    };
    const u = new uPlot(opts, data, holder);
    const shown = series.filter((x) => x.values);
    for (const c of u.root.querySelectorAll('canvas')) {
      c.setAttribute('role', 'img');
      c.setAttribute('aria-label', summary(title, time, shown));
    }
    holder.append(dataTable(title, time, shown));
    u.over.addEventListener('click', (e) => {
      state.seek(u.posToVal(e.offsetX, 'x'));
    });
    plots.push(u);
  };
  const s = base.series;
  const lb = runs.length > 1 ? ` ${base.label}` : '';
  const lo = other ? ` ${other.label}` : '';
  make(holders.error, 'Position error (m), heading error (deg)', [
    { label: `position${lb}`, values: s.positionError, colour: A[0] },
    { label: `heading${lb}`, values: s.headingErrorDeg, colour: A[1], scale: 'r' },
    { label: `position${lo}`, values: aligned('positionError'), colour: B[0], dash: [6, 4] },
  ]);
  make(holders.ess, 'Effective sample size, particle count', [
    { label: `ESS${lb}`, values: s.effectiveSampleSize, colour: A[0] },
    { label: `particles${lb}`, values: s.particles, colour: A[2], dash: [2, 3] },
    { label: `ESS${lo}`, values: aligned('effectiveSampleSize'), colour: B[0], dash: [6, 4] },
  ]);
  make(holders.likelihood, 'Mean likelihood, slow and fast averages', [
    { label: `likelihood${lb}`, values: s.meanLikelihood, colour: A[0] },
    { label: 'slow', values: s.slowAverage, colour: A[1], dash: [8, 3] },
    { label: 'fast', values: s.fastAverage, colour: A[2], dash: [2, 3] },
  ]);
  make(holders.injected, 'Injected particles', [
    { label: `injected${lb}`, values: s.injected, colour: A[1] },
    { label: `injected${lo}`, values: aligned('injected'), colour: B[2], dash: [6, 4] },
  ]);
  return {
    redraw() {
      for (const u of plots) u.redraw(false, false);
    },
  };
}
