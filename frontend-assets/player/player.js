// The run player: one or two runs of the same seed on one timeline. The cursor is a frame index;
// both runs show the same index, so a compared pair stays in step.

import { getJson, RunFrames } from './frames.js';
import { View } from './view.js';
import { buildPlots } from './plots.js';

const root = document.getElementById('player');
const status = document.getElementById('player-status');
const scrub = document.getElementById('scrub');
const clock = document.getElementById('clock');
const playButton = document.getElementById('play');
const speedSelect = document.getElementById('speed');
const LAYER_ORDER = ['map', 'world', 'particles', 'scan', 'hypotheses', 'estimate', 'truth', 'odometry'];

const state = {
  index: 0,
  playing: false,
  position: 0,
  lastTick: 0,
  runs: [],
  marks: [],
  plots: { redraw() {} },
};

function say(text) {
  status.textContent = text;
}

function fmt(v, digits) {
  return Number.isFinite(v) ? v.toFixed(digits) : 'n/a';
}

function deg(rad) {
  return (rad * 180) / Math.PI;
}

function wrap(a) {
  let x = a;
  while (x > Math.PI) x -= 2 * Math.PI;
  while (x <= -Math.PI) x += 2 * Math.PI;
  return x;
}

function frameCount() {
  return state.runs[0].frames.count;
}

function timeOf(index) {
  const s = state.runs[0].scene;
  if (s.series && Array.isArray(s.series.time) && index < s.series.time.length) {
    return s.series.time[Math.max(0, index)];
  }
  const f = state.runs[0].frames.frame(index);
  return f ? f.t : (index + 1) / (s.rate || 10);
}

function indexOf(seconds) {
  const s = state.runs[0].scene;
  const times = s.series && Array.isArray(s.series.time) ? s.series.time : null;
  const last = frameCount() - 1;
  if (!times) {
    return Math.max(0, Math.min(last, Math.round(seconds * (s.rate || 10)) - 1));
  }
  let lo = 0;
  let hi = Math.min(times.length, last + 1) - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (times[mid] < seconds - 1e-9) lo = mid + 1; else hi = mid;
  }
  return lo;
}

// Where and why a trial stopped before its route was done, in words for the marks and the readout.
function endWords(end) {
  if (!end || !end.kind || end.kind === 'completed' || !Number.isFinite(end.time)) return null;
  const at = Number.isFinite(end.x) && Number.isFinite(end.y) ? ` at (${fmt(end.x, 2)}, ${fmt(end.y, 2)})` : '';
  switch (end.kind) {
    case 'contact': return `footprint touched an obstacle${at}`;
    case 'time-limit': return `ran out of time before the route was done${at}`;
    case 'cancelled': return 'cancelled';
    default: return `${end.kind}${at}`;
  }
}

function buildMarks(scene) {
  const marks = [];
  const add = (t, label, kind) => {
    if (Number.isFinite(t)) marks.push({ t, label, kind });
  };
  for (const f of scene.faults || []) {
    if (Number.isFinite(f.at)) add(f.at, `fault ${f.id} (${f.label})`, 'fault');
  }
  if (Number.isFinite(scene.convergenceTime)) add(scene.convergenceTime, 'converged', 'episode');
  for (const k of scene.kidnaps || []) {
    const at = k.at;
    if (!Number.isFinite(at)) continue;
    // the label is the kind's label from the server's list of fault kinds (SceneJson)
    add(at, k.label, 'fault');
    if (Number.isFinite(k.noticedAfter)) add(at + k.noticedAfter, `${k.label} noticed after ${fmt(k.noticedAfter, 1)} s`, 'episode');
    if (Number.isFinite(k.recoveredAfter)) add(at + k.recoveredAfter, `recovered after ${fmt(k.recoveredAfter, 1)} s`, 'episode');
  }
  for (const e of scene.lost || []) {
    add(e.start, 'lost', 'episode');
    if (e.ended) add(e.end, 'found again', 'episode');
  }
  const stopped = endWords(scene.end);
  if (stopped) add(scene.end.time, `stopped: ${stopped}`, 'end');
  // a kidnap fault and its kidnap outcome share a time: keep one mark per time and kind
  const seen = new Set();
  return marks
    .map((m) => ({ ...m, index: indexOf(m.t) }))
    .filter((m) => {
      const key = `${m.kind}@${m.index}`;
      if (seen.has(key)) return false;
      seen.add(key);
      return true;
    })
    .sort((a, b) => a.index - b.index);
}

function drawMarks() {
  const bar = document.getElementById('marks');
  const list = document.getElementById('mark-list');
  bar.replaceChildren();
  list.replaceChildren();
  const n = Math.max(1, frameCount() - 1);
  for (const m of state.marks) {
    const tick = document.createElement('span');
    tick.className = `mark mark-${m.kind}`;
    tick.style.left = `${(100 * m.index) / n}%`;
    tick.title = `${fmt(m.t, 1)} s: ${m.label}`;
    bar.append(tick);
    const li = document.createElement('li');
    const b = document.createElement('button');
    b.type = 'button';
    b.className = `quiet mark-button mark-${m.kind}`;
    b.textContent = `${fmt(m.t, 1)} s ${m.label}`;
    b.addEventListener('click', () => seekIndex(m.index));
    li.append(b);
    list.append(li);
  }
}

function readout(run, frame) {
  const dl = run.readout;
  if (!dl) return;
  dl.replaceChildren();
  const row = (k, v) => {
    const dt = document.createElement('dt');
    dt.textContent = k;
    const dd = document.createElement('dd');
    dd.textContent = v;
    dl.append(dt, dd);
  };
  if (!frame) {
    row('Frame', 'loading...');
    return;
  }
  const [tx, ty, th] = frame.truth;
  const [ex, ey, eh] = frame.estimate;
  const err = Math.hypot(ex - tx, ey - ty);
  row('True pose', `${fmt(tx, 2)} m, ${fmt(ty, 2)} m, ${fmt(deg(th), 0)} deg`);
  row('Estimate', `${fmt(ex, 2)} m, ${fmt(ey, 2)} m, ${fmt(deg(eh), 0)} deg`);
  row('Error', `${fmt(err, 2)} m, ${fmt(Math.abs(deg(wrap(eh - th))), 1)} deg`);
  row('ESS / particles', frame.ess === null && frame.particles === 0
    ? 'not reported by the localizer'
    : `${frame.ess === null ? 'not reported' : fmt(frame.ess, 0)} of ${frame.particles}`);
  row('Likelihood', `${fmt(frame.likelihood, 4)} (slow ${fmt(frame.slow, 4)}, fast ${fmt(frame.fast, 4)})`);
  row('Injected', String(frame.injected));
  row('Hypotheses', String(frame.hypotheses.length));
  row('Events', frame.events.length ? frame.events.join('; ') : 'none');
  const end = run.scene.end;
  const stopped = endWords(end);
  if (stopped && Number.isFinite(frame.t) && frame.t >= end.time - 1e-6) {
    row('Stopped', `${stopped} at ${fmt(end.time, 1)} s`);
    dl.dataset.stopped = 'true';
  } else {
    delete dl.dataset.stopped;
  }
  dl.dataset.truthX = tx.toFixed(3);
  dl.dataset.truthY = ty.toFixed(3);
  dl.dataset.estimateX = ex.toFixed(3);
  dl.dataset.estimateY = ey.toFixed(3);
  dl.dataset.frame = String(frame.i);
}

function render() {
  const i = state.index;
  let missing = false;
  for (const run of state.runs) {
    const frame = run.frames.frame(i);
    run.frames.prefetch(i);
    if (!frame) missing = true;
    run.view.draw(frame);
    if (frame) {
      const [x, y] = run.view.pixel(frame.truth[0], frame.truth[1]);
      run.canvas.dataset.truthPx = `${x},${y}`;
      const [ex, ey] = run.view.pixel(frame.estimate[0], frame.estimate[1]);
      run.canvas.dataset.estimatePx = `${ex},${ey}`;
      run.canvas.dataset.frame = String(frame.i);
    }
    readout(run, frame);
  }
  scrub.value = String(i);
  clock.textContent = `${fmt(timeOf(i), 1)} s, frame ${i} of ${frameCount() - 1}`;
  // the slider speaks time and frame too, for whoever moves it
  scrub.setAttribute('aria-valuetext', clock.textContent);
  root.dataset.frame = String(i);
  root.dataset.ready = missing ? 'false' : 'true';
  state.plots.redraw();
}

function seekIndex(i) {
  state.index = Math.max(0, Math.min(frameCount() - 1, Math.round(i)));
  state.position = state.index;
  render();
}

function setPlaying(on) {
  state.playing = on && frameCount() > 0;
  playButton.textContent = state.playing ? 'Pause' : 'Play';
  playButton.setAttribute('aria-pressed', state.playing ? 'true' : 'false');
  root.dataset.playing = state.playing ? 'true' : 'false';
  // while playing, the frame readout would speak ten times a second: it is quiet until paused
  clock.setAttribute('aria-live', state.playing ? 'off' : 'polite');
  if (state.playing) {
    state.lastTick = performance.now();
    state.position = state.index;
    requestAnimationFrame(tick);
  }
}

function tick(now) {
  if (!state.playing) return;
  const dt = Math.min(0.25, (now - state.lastTick) / 1000);
  state.lastTick = now;
  const next = Math.min(frameCount() - 1, Math.floor(state.position));
  // wait for a chunk still on its way instead of skipping frames
  const ready = state.runs.every((r) => r.frames.frame(next) !== null);
  if (ready) {
    const rate = state.runs[0].scene.rate || 10;
    state.position += dt * rate * Number(speedSelect.value);
    const i = Math.min(frameCount() - 1, Math.floor(state.position));
    if (i !== state.index) {
      state.index = i;
      render();
    }
    if (i >= frameCount() - 1) {
      setPlaying(false);
      return;
    }
  }
  requestAnimationFrame(tick);
}

function jumpMark(direction) {
  const i = state.index;
  const m = direction > 0
    ? state.marks.find((x) => x.index > i)
    : [...state.marks].reverse().find((x) => x.index < i);
  if (m) {
    seekIndex(m.index);
    say(`${fmt(m.t, 1)} s: ${m.label}`);
  }
}

function changeSpeed(step) {
  const k = speedSelect.selectedIndex + step;
  if (k >= 0 && k < speedSelect.options.length) speedSelect.selectedIndex = k;
}

function toggleLayer(name, on) {
  for (const run of state.runs) {
    if (on) run.view.layers.add(name); else run.view.layers.delete(name);
  }
  render();
}

/**
 * The player's single keys act on the page itself, the run views and the timeline's slider and
 * buttons, never on form fields: Space on a layer checkbox toggles the layer, not play.
 */
function shortcutTarget(t) {
  if (!t || t === document.body || t === document.documentElement) return true;
  if (t.classList && t.classList.contains('view-canvas')) return true;
  const timeline = document.getElementById('timeline');
  if (!timeline || !timeline.contains(t)) return false;
  return t.tagName === 'BUTTON' || (t.tagName === 'INPUT' && t.type === 'range') || t === timeline;
}

function wire() {
  playButton.addEventListener('click', () => setPlaying(!state.playing));
  document.getElementById('step-back').addEventListener('click', () => seekIndex(state.index - 1));
  document.getElementById('step-on').addEventListener('click', () => seekIndex(state.index + 1));
  document.getElementById('next-mark').addEventListener('click', () => jumpMark(1));
  document.getElementById('prev-mark').addEventListener('click', () => jumpMark(-1));
  scrub.addEventListener('input', () => seekIndex(Number(scrub.value)));
  for (const box of document.querySelectorAll('[data-layer]')) {
    box.addEventListener('change', () => toggleLayer(box.dataset.layer, box.checked));
  }
  document.addEventListener('keydown', (e) => {
    if (e.ctrlKey || e.metaKey || e.altKey || !shortcutTarget(e.target)) return;
    const tag = e.target.tagName;
    const step = e.shiftKey ? 10 : 1;
    let handled = true;
    switch (e.key) {
      case ' ':
        if (tag === 'BUTTON') { handled = false; break; }
        setPlaying(!state.playing); break;
      case 'ArrowLeft': seekIndex(state.index - step); break;
      case 'ArrowRight': seekIndex(state.index + step); break;
      case 'n': case 'N': jumpMark(1); break;
      case 'p': case 'P': jumpMark(-1); break;
      case '+': case '=': changeSpeed(1); break;
      case '-': changeSpeed(-1); break;
      case 'Home': seekIndex(0); break;
      case 'End': seekIndex(frameCount() - 1); break;
      default: {
        const k = Number(e.key);
        if (Number.isInteger(k) && k >= 1 && k <= LAYER_ORDER.length) {
          const box = document.querySelector(`[data-layer="${LAYER_ORDER[k - 1]}"]`);
          box.checked = !box.checked;
          toggleLayer(box.dataset.layer, box.checked);
        } else {
          handled = false;
        }
      }
    }
    if (handled) e.preventDefault();
  });
  let resizeTimer = 0;
  window.addEventListener('resize', () => {
    clearTimeout(resizeTimer);
    resizeTimer = setTimeout(() => { for (const r of state.runs) r.view.fit(); render(); }, 150);
  });
}

async function start() {
  const bases = [root.dataset.a, root.dataset.b].filter((b) => b);
  const ids = ['a', 'b'];
  const scenes = await Promise.all(bases.map((b) => getJson(`${b}/scene`)));
  state.runs = scenes.map((scene, k) => {
    const canvas = document.getElementById(`view-${ids[k]}`);
    const run = {
      scene,
      canvas,
      readout: document.getElementById(`readout-${ids[k]}`),
      frames: new RunFrames(bases[k], scene),
      view: new View(canvas, scene),
      label: `#${scene.run} ${scene.runVariant}`,
    };
    run.frames.onLoaded = () => render();
    return run;
  });
  if (frameCount() === 0) {
    say('This run has no recorded frames. Run it again with "record frames" on to play it.');
    for (const r of state.runs) r.view.draw(null);
    root.dataset.ready = 'true';
    return;
  }
  if (state.runs.length > 1 && state.runs[1].frames.count !== frameCount()) {
    say('The two runs have different frame counts; they are shown frame by frame from the start.');
  } else {
    say(`${frameCount()} frames, ${scenes[0].chunks.length} chunks. Frames load as the cursor reaches them.`);
  }
  scrub.max = String(frameCount() - 1);
  state.marks = buildMarks(scenes[0]);
  drawMarks();
  wire();
  try {
    const { default: uPlot } = await import(root.dataset.uplot);
    state.plots = buildPlots(uPlot, state.runs.map((r) => ({ label: r.label, series: r.scene.series })), {
      time: () => timeOf(state.index),
      endTime: () => (endWords(scenes[0].end) ? scenes[0].end.time : NaN),
      seek: (t) => seekIndex(indexOf(t)),
    });
  } catch (e) {
    for (const id of ['plot-error', 'plot-ess', 'plot-likelihood', 'plot-injected']) {
      document.getElementById(id).textContent = 'The plots could not be drawn.';
    }
  }
  render();
}

start().catch((e) => {
  say(`The player could not start: ${e.message}`);
  root.dataset.ready = 'error';
});
