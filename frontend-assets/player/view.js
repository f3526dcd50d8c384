// Draws one frame of a run on a canvas: the believed map, where the actual world differs, the
// particles, the scan, the hypotheses, the estimate and the true robot. Okabe-Ito hues, and every
// mark also differs by shape or line style so colour is never the only cue.

export const COLOURS = {
  paper: '#fbfbf8',
  room: '#ffffff',
  wall: '#1d2630',
  fixture: '#c9ced3',
  diff: '#D55E00',
  particle: [204, 121, 167],
  hit: '#E69F00',
  miss: 'rgba(91, 104, 115, 0.18)',
  ray: 'rgba(230, 159, 0, 0.16)',
  hyp: '#56B4E9',
  estimate: '#0072B2',
  truth: '#009E73',
  odometry: '#7a6a00',
};

const ROBOT_RADIUS = 0.28;

export class View {
  constructor(canvas, scene) {
    this.canvas = canvas;
    this.scene = scene;
    this.ctx = canvas.getContext('2d');
    this.layers = new Set(['map', 'world', 'particles', 'scan', 'hypotheses', 'estimate', 'truth']);
    this.hatch = null;
    this.fit();
  }

  fit() {
    const cssWidth = this.canvas.clientWidth || this.canvas.width;
    const [x0, y0, x1, y1] = this.scene.bounds;
    const margin = 0.6;
    const w = x1 - x0 + 2 * margin;
    const h = y1 - y0 + 2 * margin;
    // keep the timeline on screen at 1280x800: the view never takes more than about half the height
    const cssHeight = Math.round(Math.min(cssWidth * Math.min(1.2, h / w), Math.max(260, window.innerHeight * 0.5)));
    const dpr = window.devicePixelRatio || 1;
    this.canvas.width = Math.round(cssWidth * dpr);
    this.canvas.height = Math.round(cssHeight * dpr);
    this.canvas.style.height = `${cssHeight}px`;
    this.scale = Math.min(this.canvas.width / w, this.canvas.height / h);
    this.ox = (this.canvas.width - w * this.scale) / 2 - (x0 - margin) * this.scale;
    this.oy = (this.canvas.height + h * this.scale) / 2 + (y0 - margin) * this.scale;
    this.hatch = null;
  }

  px(x) { return this.ox + x * this.scale; }
  py(y) { return this.oy - y * this.scale; }

  /** Canvas buffer pixel of a world point, rounded (tests read pixels there). */
  pixel(x, y) {
    return [Math.round(this.px(x)), Math.round(this.py(y))];
  }

  draw(frame) {
    const c = this.ctx;
    c.setTransform(1, 0, 0, 1, 0, 0);
    c.fillStyle = COLOURS.paper;
    c.fillRect(0, 0, this.canvas.width, this.canvas.height);
    const on = (l) => this.layers.has(l);
    if (on('map')) this.drawMap();
    if (frame && on('world')) this.drawDifferences(frame.t);
    if (!frame) return;
    if (on('particles')) this.drawParticles(frame);
    if (on('scan')) this.drawScan(frame);
    if (on('hypotheses')) this.drawHypotheses(frame);
    if (on('odometry')) this.drawPose(frame.odometry, 'odometry');
    if (on('estimate')) this.drawPose(frame.estimate, 'estimate');
    if (on('truth')) this.drawPose(frame.truth, 'truth');
  }

  polygon(flat) {
    const c = this.ctx;
    c.beginPath();
    for (let i = 0; i < flat.length; i += 2) {
      const x = this.px(flat[i]);
      const y = this.py(flat[i + 1]);
      if (i === 0) c.moveTo(x, y); else c.lineTo(x, y);
    }
    c.closePath();
  }

  segment(s) {
    const c = this.ctx;
    c.beginPath();
    c.moveTo(this.px(s[0]), this.py(s[1]));
    c.lineTo(this.px(s[2]), this.py(s[3]));
  }

  drawMap() {
    const c = this.ctx;
    c.fillStyle = COLOURS.room;
    for (const r of this.scene.rooms) { this.polygon(r.outline); c.fill(); }
    c.fillStyle = COLOURS.fixture;
    c.strokeStyle = '#5b6873';
    c.lineWidth = 1;
    for (const f of this.scene.fixtures) { this.polygon(f.outline); c.fill(); c.stroke(); }
    c.strokeStyle = COLOURS.wall;
    c.lineWidth = Math.max(2, 0.06 * this.scale);
    c.lineCap = 'round';
    for (const w of this.scene.walls) { this.segment(w); c.stroke(); }
  }

  hatchPattern() {
    if (this.hatch) return this.hatch;
    const t = document.createElement('canvas');
    t.width = 8; t.height = 8;
    const g = t.getContext('2d');
    g.strokeStyle = COLOURS.diff;
    g.lineWidth = 2;
    g.beginPath(); g.moveTo(0, 8); g.lineTo(8, 0); g.stroke();
    this.hatch = this.ctx.createPattern(t, 'repeat');
    return this.hatch;
  }

  drawDifferences(t) {
    const c = this.ctx;
    c.lineWidth = Math.max(3, 0.09 * this.scale);
    c.strokeStyle = COLOURS.diff;
    for (const d of this.scene.doors) {
      if (d.mapped === d.actual) continue;
      // a door the map calls open but is shut: solid bar; mapped shut but open: dashed gap
      c.setLineDash(d.actual === 'closed' ? [] : [6, 5]);
      this.segment(d.at);
      c.stroke();
    }
    c.setLineDash([]);
    c.lineWidth = 2;
    for (const k of this.scene.clutter) {
      const from = k.from ?? 0;
      const until = k.until ?? Infinity;
      if (t < from || t >= until) continue;
      this.polygon(k.outline);
      c.fillStyle = this.hatchPattern();
      c.fill();
      c.stroke();
    }
  }

  drawParticles(f) {
    const c = this.ctx;
    const [r, g, b] = COLOURS.particle;
    const size = Math.max(2, Math.round(this.scale * 0.05));
    const half = size / 2;
    for (let i = 0; i < f.px.length; i++) {
      const a = 0.12 + 0.88 * f.pw[i];
      c.fillStyle = `rgba(${r},${g},${b},${a.toFixed(3)})`;
      c.fillRect(this.px(f.px[i]) - half, this.py(f.py[i]) - half, size, size);
    }
  }

  drawScan(f) {
    const c = this.ctx;
    const s = this.scene;
    const [tx, ty, th] = f.truth;
    const [mx, my, mh] = s.mount;
    const sx = tx + mx * Math.cos(th) - my * Math.sin(th);
    const sy = ty + mx * Math.sin(th) + my * Math.cos(th);
    const ox = this.px(sx);
    const oy = this.py(sy);
    const limit = s.maxRange * 0.999;
    c.lineWidth = 1;
    const hits = [];
    for (let i = 0; i < f.ranges.length && i < s.beams.length; i++) {
      const r = f.ranges[i];
      const a = th + mh + s.beams[i];
      const ex = this.px(sx + r * Math.cos(a));
      const ey = this.py(sy + r * Math.sin(a));
      const miss = r >= limit;
      c.strokeStyle = miss ? COLOURS.miss : COLOURS.ray;
      c.setLineDash(miss ? [3, 4] : []);
      c.beginPath(); c.moveTo(ox, oy); c.lineTo(ex, ey); c.stroke();
      if (!miss) hits.push(ex, ey);
    }
    c.setLineDash([]);
    c.fillStyle = COLOURS.hit;
    for (let i = 0; i < hits.length; i += 2) {
      c.fillRect(hits[i] - 1.5, hits[i + 1] - 1.5, 3, 3);
    }
  }

  drawHypotheses(f) {
    const c = this.ctx;
    for (const [w, x, y, h, cxx, cxy, cyy] of f.hypotheses) {
      if (cxx === null || cxy === null || cyy === null) {
        // an outside localizer gave no covariance: the place and heading only, no made-up spread
        this.tick(x, y, h, COLOURS.hyp, 0.5);
        continue;
      }
      // eigen-decomposition of the 2x2 covariance gives the axes of the spread ellipse
      const tr = (cxx + cyy) / 2;
      const det = Math.sqrt(Math.max(0, ((cxx - cyy) / 2) ** 2 + cxy * cxy));
      const l1 = Math.max(tr + det, 1e-6);
      const l2 = Math.max(tr - det, 1e-6);
      const angle = 0.5 * Math.atan2(2 * cxy, cxx - cyy);
      const rx = Math.max(3, 2 * Math.sqrt(l1) * this.scale);
      const ry = Math.max(3, 2 * Math.sqrt(l2) * this.scale);
      c.beginPath();
      c.ellipse(this.px(x), this.py(y), rx, ry, -angle, 0, 2 * Math.PI);
      c.fillStyle = `rgba(86, 180, 233, ${(0.08 + 0.3 * w).toFixed(3)})`;
      c.fill();
      c.strokeStyle = COLOURS.hyp;
      c.lineWidth = 1.5;
      c.stroke();
      c.fillStyle = '#1d2630';
      c.font = `${Math.round(11 * (window.devicePixelRatio || 1))}px system-ui, sans-serif`;
      c.fillText(`${Math.round(w * 100)} %`, this.px(x) + rx + 3, this.py(y) - 3);
      this.tick(x, y, h, COLOURS.hyp, 0.5);
    }
  }

  tick(x, y, h, colour, length) {
    const c = this.ctx;
    c.strokeStyle = colour;
    c.lineWidth = 2;
    c.beginPath();
    c.moveTo(this.px(x), this.py(y));
    c.lineTo(this.px(x + length * Math.cos(h)), this.py(y + length * Math.sin(h)));
    c.stroke();
  }

  drawPose(p, kind) {
    const c = this.ctx;
    const [x, y, h] = p;
    const r = Math.max(6, ROBOT_RADIUS * this.scale);
    const cx = this.px(x);
    const cy = this.py(y);
    if (kind === 'truth') {
      c.beginPath();
      c.arc(cx, cy, r, 0, 2 * Math.PI);
      c.fillStyle = COLOURS.truth;
      c.fill();
      c.strokeStyle = '#0b2f25';
      c.lineWidth = 2;
      c.stroke();
      // heading mark starts off-centre so the centre pixel stays the robot's colour
      c.strokeStyle = '#ffffff';
      c.lineWidth = 2.5;
      c.beginPath();
      c.moveTo(cx + 0.35 * r * Math.cos(h), cy - 0.35 * r * Math.sin(h));
      c.lineTo(cx + r * Math.cos(h), cy - r * Math.sin(h));
      c.stroke();
      return;
    }
    const colour = kind === 'estimate' ? COLOURS.estimate : COLOURS.odometry;
    const len = r * 1.9;
    const tipX = cx + len * Math.cos(h);
    const tipY = cy - len * Math.sin(h);
    const back = 0.7 * r;
    const lx = cx + back * Math.cos(h + 2.4);
    const ly = cy - back * Math.sin(h + 2.4);
    const rx = cx + back * Math.cos(h - 2.4);
    const ry = cy - back * Math.sin(h - 2.4);
    c.setLineDash(kind === 'odometry' ? [4, 3] : []);
    c.strokeStyle = colour;
    c.lineWidth = kind === 'estimate' ? 3 : 2;
    c.beginPath();
    c.moveTo(tipX, tipY); c.lineTo(lx, ly); c.lineTo(cx, cy); c.lineTo(rx, ry); c.closePath();
    c.stroke();
    c.setLineDash([]);
  }
}
