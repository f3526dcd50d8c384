// Drawing the site plan on the canvas. Colours come from the Okabe-Ito set so that they stay
// apart for colour-blind readers, and every kind also differs in line style or fill pattern.
import { doorGeometry, positionAt, targetOf } from './model.js';

export const COLOURS = {
  wall: '#1b1e23',
  roomFill: '#f3f0e8',
  grid: '#e3e1da',
  gridMajor: '#cfccc3',
  fixture: '#56b4e9',
  fixtureLine: '#0b5d8c',
  zone: '#f0e442',
  zoneLine: '#8a7f00',
  clutter: '#cc79a7',
  route: '#009e73',
  doorOpen: '#0072b2',
  doorClosed: '#e69f00',
  fault: '#d55e00',
  pick: '#0072b2',
  draft: '#6a3d9a',
};

/** World (metres, y north) to canvas pixels and back. */
export class View {
  constructor() {
    this.scale = 40;
    this.ox = 40;
    this.oy = 400;
  }

  sx(x) {
    return this.ox + x * this.scale;
  }

  sy(y) {
    return this.oy - y * this.scale;
  }

  wx(px) {
    return (px - this.ox) / this.scale;
  }

  wy(py) {
    return (this.oy - py) / this.scale;
  }

  fit(b, w, h) {
    // room for labels drawn beside items at the plan's edge
    const pad = 70;
    const bw = Math.max(1, b.x1 - b.x0);
    const bh = Math.max(1, b.y1 - b.y0);
    this.scale = Math.max(2, Math.min((w - 2 * pad) / bw, (h - 2 * pad) / bh, 400));
    this.ox = (w - bw * this.scale) / 2 - b.x0 * this.scale;
    this.oy = h - (h - bh * this.scale) / 2 + b.y0 * this.scale;
  }

  zoomAt(px, py, factor) {
    const x = this.wx(px);
    const y = this.wy(py);
    this.scale = Math.max(2, Math.min(800, this.scale * factor));
    this.ox = px - x * this.scale;
    this.oy = py + y * this.scale;
  }
}

function outlinePath(ctx, v, outline) {
  ctx.beginPath();
  outline.forEach(([x, y], i) => (i ? ctx.lineTo(v.sx(x), v.sy(y)) : ctx.moveTo(v.sx(x), v.sy(y))));
  ctx.closePath();
}

function hatch(ctx, colour) {
  const c = document.createElement('canvas');
  c.width = 8;
  c.height = 8;
  const g = c.getContext('2d');
  g.strokeStyle = colour;
  g.lineWidth = 1.5;
  g.beginPath();
  g.moveTo(0, 8);
  g.lineTo(8, 0);
  g.stroke();
  return ctx.createPattern(c, 'repeat');
}

function drawGrid(ctx, v, w, h, step) {
  const px = step * v.scale;
  if (px < 6) {
    return;
  }
  const x0 = Math.floor(v.wx(0) / step) * step;
  const y0 = Math.floor(v.wy(h) / step) * step;
  ctx.lineWidth = 1;
  for (let x = x0; v.sx(x) <= w; x += step) {
    ctx.strokeStyle = Math.abs(x - Math.round(x)) < 1e-6 ? COLOURS.gridMajor : COLOURS.grid;
    ctx.beginPath();
    ctx.moveTo(Math.round(v.sx(x)) + 0.5, 0);
    ctx.lineTo(Math.round(v.sx(x)) + 0.5, h);
    ctx.stroke();
  }
  for (let y = y0; v.sy(y) >= 0; y += step) {
    ctx.strokeStyle = Math.abs(y - Math.round(y)) < 1e-6 ? COLOURS.gridMajor : COLOURS.grid;
    ctx.beginPath();
    ctx.moveTo(0, Math.round(v.sy(y)) + 0.5);
    ctx.lineTo(w, Math.round(v.sy(y)) + 0.5);
    ctx.stroke();
  }
}

/**
 * The wall pieces the server's live check cut (`walls`: [x0, y0, x1, y1] in metres), so the plan
 * shows the openings the simulated world has. Until a check of the current document has answered
 * (or when the document cannot be read), room outlines are drawn whole.
 */
function drawWalls(ctx, v, site, walls) {
  ctx.strokeStyle = COLOURS.wall;
  ctx.lineWidth = 4;
  ctx.lineCap = 'butt';
  const line = (x0, y0, x1, y1) => {
    ctx.beginPath();
    ctx.moveTo(v.sx(x0), v.sy(y0));
    ctx.lineTo(v.sx(x1), v.sy(y1));
    ctx.stroke();
  };
  if (walls) {
    walls.forEach((w) => line(w[0], w[1], w[2], w[3]));
    return;
  }
  site.rooms.forEach((r) => {
    const o = r.outline;
    for (let i = 0; i < o.length; i++) {
      const b = o[(i + 1) % o.length];
      line(o[i][0], o[i][1], b[0], b[1]);
    }
  });
}

function drawDoor(ctx, v, doc, d, picked) {
  const g = doorGeometry(doc, d);
  if (!g) {
    return;
  }
  const closed = d.actual === 'closed';
  ctx.strokeStyle = closed ? COLOURS.doorClosed : COLOURS.doorOpen;
  ctx.lineWidth = closed ? 6 : 2;
  ctx.setLineDash(closed ? [] : [4, 3]);
  ctx.beginPath();
  ctx.moveTo(v.sx(g.a[0]), v.sy(g.a[1]));
  ctx.lineTo(v.sx(g.b[0]), v.sy(g.b[1]));
  ctx.stroke();
  ctx.setLineDash([]);
  // jambs mark the opening whatever its state
  ctx.fillStyle = COLOURS.wall;
  for (const p of [g.a, g.b]) {
    ctx.fillRect(v.sx(p[0]) - 3, v.sy(p[1]) - 3, 6, 6);
  }
  if (d.mapped !== d.actual) {
    // the map disagrees with reality: a ring and a letter, not colour alone
    ctx.strokeStyle = COLOURS.fault;
    ctx.lineWidth = 2;
    ctx.beginPath();
    ctx.arc(v.sx(g.cx), v.sy(g.cy), 9, 0, 2 * Math.PI);
    ctx.stroke();
    ctx.fillStyle = COLOURS.fault;
    ctx.font = 'bold 11px system-ui, sans-serif';
    ctx.fillText('≠', v.sx(g.cx) + 10, v.sy(g.cy) - 8);
  }
  if (picked) {
    ctx.strokeStyle = COLOURS.pick;
    ctx.lineWidth = 2;
    ctx.strokeRect(Math.min(v.sx(g.a[0]), v.sx(g.b[0])) - 6, Math.min(v.sy(g.a[1]), v.sy(g.b[1])) - 6,
      Math.abs(v.sx(g.b[0]) - v.sx(g.a[0])) + 12, Math.abs(v.sy(g.b[1]) - v.sy(g.a[1])) + 12);
  }
}

function arrow(ctx, v, x, y, headingDeg, colour, size = 14) {
  const a = (headingDeg * Math.PI) / 180;
  const px = v.sx(x);
  const py = v.sy(y);
  ctx.fillStyle = colour;
  ctx.beginPath();
  ctx.moveTo(px + Math.cos(a) * size, py - Math.sin(a) * size);
  ctx.lineTo(px + Math.cos(a + 2.5) * size * 0.7, py - Math.sin(a + 2.5) * size * 0.7);
  ctx.lineTo(px + Math.cos(a - 2.5) * size * 0.7, py - Math.sin(a - 2.5) * size * 0.7);
  ctx.closePath();
  ctx.fill();
}

function label(ctx, text, x0, y, colour) {
  ctx.font = '12px system-ui, sans-serif';
  ctx.fillStyle = 'rgba(255,255,255,0.85)';
  const w = ctx.measureText(text).width;
  // labels near the right edge move inwards rather than being cut off
  const right = ctx.canvas.clientWidth || ctx.canvas.width;
  const x = x0 + w + 6 > right ? Math.max(2, right - w - 6) : x0;
  ctx.fillRect(x - 2, y - 11, w + 4, 14);
  ctx.fillStyle = colour;
  ctx.fillText(text, x, y);
}

function handles(ctx, v, outline) {
  ctx.fillStyle = '#fff';
  ctx.strokeStyle = COLOURS.pick;
  ctx.lineWidth = 2;
  for (const [x, y] of outline) {
    ctx.fillRect(v.sx(x) - 4, v.sy(y) - 4, 8, 8);
    ctx.strokeRect(v.sx(x) - 4, v.sy(y) - 4, 8, 8);
  }
}

/** Draws everything; `state` carries the view, the picked item and any draft being drawn. */
export function draw(ctx, w, h, doc, state) {
  const v = state.view;
  const site = doc.site;
  ctx.fillStyle = '#fbfaf6';
  ctx.fillRect(0, 0, w, h);
  drawGrid(ctx, v, w, h, state.grid);
  const isPicked = (list, i) => state.pick && state.pick.list === list && state.pick.index === i;

  site.rooms.forEach((r) => {
    outlinePath(ctx, v, r.outline);
    ctx.fillStyle = COLOURS.roomFill;
    ctx.fill();
  });
  site.floorZones.forEach((z) => {
    outlinePath(ctx, v, z.outline);
    ctx.fillStyle = 'rgba(240, 228, 66, 0.35)';
    ctx.fill();
    ctx.fillStyle = hatch(ctx, COLOURS.zoneLine);
    ctx.fill();
    ctx.strokeStyle = COLOURS.zoneLine;
    ctx.lineWidth = 1;
    ctx.stroke();
  });
  drawWalls(ctx, v, site, state.walls);
  site.fixtures.forEach((f) => {
    outlinePath(ctx, v, f.outline);
    ctx.fillStyle = 'rgba(86, 180, 233, 0.55)';
    ctx.fill();
    ctx.strokeStyle = COLOURS.fixtureLine;
    ctx.lineWidth = 2;
    ctx.stroke();
  });
  site.clutter.forEach((c) => {
    outlinePath(ctx, v, c.outline);
    ctx.fillStyle = 'rgba(204, 121, 167, 0.3)';
    ctx.fill();
    ctx.strokeStyle = COLOURS.clutter;
    ctx.setLineDash([6, 4]);
    ctx.lineWidth = 2;
    ctx.stroke();
    ctx.setLineDash([]);
  });
  site.doors.forEach((d, i) => drawDoor(ctx, v, doc, d, isPicked('doors', i)));
  if (state.labels) {
    site.rooms.forEach((r) => {
      const [x, y] = r.outline[0] || [0, 0];
      label(ctx, r.name || r.id, v.sx(x) + 6, v.sy(y) - 8, COLOURS.wall);
    });
  }

  // route
  const r = doc.route;
  ctx.strokeStyle = COLOURS.route;
  ctx.lineWidth = 2;
  ctx.setLineDash([10, 4]);
  ctx.beginPath();
  ctx.moveTo(v.sx(r.start.x), v.sy(r.start.y));
  r.waypoints.forEach((p) => ctx.lineTo(v.sx(p.x), v.sy(p.y)));
  ctx.stroke();
  ctx.setLineDash([]);
  r.waypoints.forEach((p, i) => {
    ctx.fillStyle = isPicked('waypoints', i) ? COLOURS.pick : COLOURS.route;
    ctx.beginPath();
    ctx.arc(v.sx(p.x), v.sy(p.y), 7, 0, 2 * Math.PI);
    ctx.fill();
    ctx.fillStyle = '#fff';
    ctx.font = 'bold 9px system-ui, sans-serif';
    ctx.textAlign = 'center';
    ctx.fillText(String(i + 1), v.sx(p.x), v.sy(p.y) + 3);
    ctx.textAlign = 'start';
  });
  ctx.strokeStyle = isPicked('start', 0) ? COLOURS.pick : COLOURS.route;
  ctx.lineWidth = 3;
  ctx.beginPath();
  ctx.arc(v.sx(r.start.x), v.sy(r.start.y), 10, 0, 2 * Math.PI);
  ctx.stroke();
  arrow(ctx, v, r.start.x, r.start.y, r.start.heading || 0, isPicked('start', 0) ? COLOURS.pick : COLOURS.route, 18);

  // faults placed on the plan, and the poses some kinds set down (a kidnap's "to")
  doc.faults.forEach((f, i) => {
    const picked = isPicked('faults', i);
    if (f.near) {
      ctx.strokeStyle = picked ? COLOURS.pick : COLOURS.fault;
      ctx.lineWidth = picked ? 3 : 2;
      ctx.setLineDash([3, 3]);
      ctx.beginPath();
      ctx.arc(v.sx(f.near.x), v.sy(f.near.y), Math.max(4, f.near.radius * v.scale), 0, 2 * Math.PI);
      ctx.stroke();
      ctx.setLineDash([]);
      label(ctx, f.kind, v.sx(f.near.x) + 6, v.sy(f.near.y) - 6, COLOURS.fault);
    }
    const to = f[targetOf(f.kind)];
    if (to) {
      const from = f.near ? [f.near.x, f.near.y] : positionAt(doc, f.at || 0);
      ctx.strokeStyle = picked ? COLOURS.pick : COLOURS.fault;
      ctx.lineWidth = 2;
      ctx.setLineDash([2, 5]);
      ctx.beginPath();
      ctx.moveTo(v.sx(from[0]), v.sy(from[1]));
      ctx.lineTo(v.sx(to.x), v.sy(to.y));
      ctx.stroke();
      ctx.setLineDash([]);
      ctx.beginPath();
      ctx.rect(v.sx(to.x) - 9, v.sy(to.y) - 9, 18, 18);
      ctx.stroke();
      arrow(ctx, v, to.x, to.y, to.heading || 0, picked ? COLOURS.pick : COLOURS.fault, 16);
      label(ctx, `${f.id}: carried here`, v.sx(to.x) + 12, v.sy(to.y) + 20, COLOURS.fault);
    }
  });

  // the picked outline on top
  if (state.pick && ['rooms', 'fixtures', 'floorZones', 'clutter'].includes(state.pick.list)) {
    const item = site[state.pick.list][state.pick.index];
    if (item) {
      outlinePath(ctx, v, item.outline);
      ctx.strokeStyle = COLOURS.pick;
      ctx.lineWidth = 2;
      ctx.setLineDash([8, 4]);
      ctx.stroke();
      ctx.setLineDash([]);
      handles(ctx, v, item.outline);
    }
  }

  // a shape being drawn, with its lengths in metres
  if (state.draft) {
    const d = state.draft;
    ctx.strokeStyle = COLOURS.draft;
    ctx.lineWidth = 2;
    ctx.setLineDash([5, 3]);
    ctx.beginPath();
    d.points.forEach(([x, y], i) => (i ? ctx.lineTo(v.sx(x), v.sy(y)) : ctx.moveTo(v.sx(x), v.sy(y))));
    if (d.closed) {
      ctx.closePath();
    }
    ctx.stroke();
    ctx.setLineDash([]);
    for (let i = 0; i + 1 < d.points.length || (d.closed && i < d.points.length); i++) {
      const a = d.points[i];
      const b = d.points[(i + 1) % d.points.length];
      const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
      if (len > 0.001) {
        label(ctx, `${len.toFixed(2)} m`, v.sx((a[0] + b[0]) / 2) + 4, v.sy((a[1] + b[1]) / 2) - 4, COLOURS.draft);
      }
    }
  }
  if (state.snapMark) {
    ctx.strokeStyle = COLOURS.draft;
    ctx.lineWidth = 1.5;
    const [x, y] = state.snapMark;
    ctx.beginPath();
    ctx.arc(v.sx(x), v.sy(y), 6, 0, 2 * Math.PI);
    ctx.stroke();
  }
}
