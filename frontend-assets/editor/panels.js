// The editor's DOM panels: the picked item's fields, the route table, the fault timeline and the
// check list. Everything the user typed goes in through textContent or input values, never as
// markup.
import {
  faultKind, faultKinds, fieldsOf, getPath, listOf, renameReferences, routeTimes, setPath, targetOf,
} from './model.js';

function el(tag, attrs = {}, text) {
  const e = document.createElement(tag);
  for (const [k, v] of Object.entries(attrs)) {
    if (v !== undefined && v !== null && v !== false) {
      e.setAttribute(k, v === true ? '' : v);
    }
  }
  if (text !== undefined) {
    e.textContent = text;
  }
  return e;
}

/** Parses an input's text by field type; undefined means "leave the key out". */
function parseField(type, input) {
  if (type === 'bool') {
    return input.checked;
  }
  const text = input.value.trim();
  if (type === 'text' || type === 'choice') {
    return text;
  }
  if (text === '' && type === 'num?') {
    return undefined;
  }
  const n = Number(text);
  if (text === '' || !Number.isFinite(n)) {
    return null;
  }
  return type === 'int' ? Math.round(n) : n;
}

function fieldInput(id, key, label, type, choices, value, editable) {
  const row = el('div', { class: 'ed-field' });
  const lab = el('label', { for: id }, label);
  let input;
  if (type === 'choice') {
    input = el('select', { id });
    const all = choices.includes(value) || value === undefined ? choices : [value, ...choices];
    for (const c of all) {
      const o = el('option', { value: c }, c === '' ? '(none)' : c);
      if (c === value) {
        o.selected = true;
      }
      input.append(o);
    }
  } else if (type === 'bool') {
    input = el('input', { id, type: 'checkbox' });
    input.checked = Boolean(value);
  } else {
    input = el('input', { id, type: type === 'text' ? 'text' : 'number', step: 'any' });
    input.value = value === undefined || value === null ? '' : String(value);
  }
  input.dataset.key = key;
  input.dataset.type = type;
  input.disabled = !editable;
  row.append(lab, input);
  return row;
}

/** The picked item's fields; `onChange(key, value)` commits one change. */
export function renderProps(host, doc, pick, editable, onChange) {
  host.replaceChildren();
  if (!pick) {
    host.append(el('p', { class: 'meta' }, 'Nothing picked. Pick an item on the plan, in the route table or on the fault timeline.'));
    return;
  }
  const item = pick.list === 'start' ? doc.route.start : listOf(doc, pick.list)[pick.index];
  if (!item) {
    host.append(el('p', { class: 'meta' }, 'Nothing picked.'));
    return;
  }
  const names = {
    rooms: 'Room', doors: 'Door', fixtures: 'Fixture', floorZones: 'Floor zone', clutter: 'Clutter',
    start: 'Start pose', waypoints: 'Waypoint', faults: 'Fault',
  };
  const title = pick.list === 'faults' ? `Fault: ${item.kind}` : names[pick.list];
  host.append(el('h3', { class: 'ed-kind' }, pick.list === 'waypoints' ? `${title} ${pick.index + 1}` : title));
  const form = el('div', { class: 'ed-fields', id: 'ed-fields' });
  fieldsOf(doc, pick).forEach(([key, label, type, choices], i) => {
    form.append(fieldInput(`ed-f-${i}`, key, label, type, choices || [], getPath(item, key), editable));
  });
  form.addEventListener('change', (e) => {
    const input = e.target;
    const value = parseField(input.dataset.type, input);
    if (value === null) {
      input.setAttribute('aria-invalid', 'true');
      return;
    }
    onChange(input.dataset.key, value);
  });
  host.append(form);
  if (item.outline) {
    const corners = item.outline.map(([x, y]) => `(${x}, ${y})`).join(' ');
    host.append(el('p', { class: 'meta ed-corners' }, `${item.outline.length} corners: ${corners}`));
  }
}

/** Sets a field on the picked item (used by the props panel and the route table). */
export function applyField(doc, pick, key, value) {
  const item = pick.list === 'start' ? doc.route.start : listOf(doc, pick.list)[pick.index];
  const before = item.id;
  setPath(item, key, value);
  if (key === 'id' && before !== value) {
    renameReferences(doc, pick.list, before, value);
  }
}

/** Route table: the start pose, each waypoint, the settle time. */
export function renderRoute(table, doc, pick, editable, handlers) {
  table.replaceChildren();
  const head = el('thead');
  const hr = el('tr');
  for (const h of ['', 'x (m)', 'y (m)', 'speed (m/s) / heading (deg)', 'dwell (s)', '']) {
    hr.append(el('th', { scope: 'col' }, h));
  }
  head.append(hr);
  const body = el('tbody');
  const row = (name, sel, cells) => {
    const tr = el('tr');
    if (pick && pick.list === sel.list && pick.index === sel.index) {
      tr.classList.add('picked');
    }
    const th = el('th', { scope: 'row' });
    const b = el('button', { type: 'button', class: 'linkish' }, name);
    b.addEventListener('click', () => handlers.pick(sel));
    th.append(b);
    tr.append(th);
    for (const [key, value] of cells) {
      const td = el('td');
      if (key) {
        const input = el('input', { type: 'number', step: 'any', 'aria-label': `${name} ${key}` });
        input.value = value;
        input.disabled = !editable;
        input.addEventListener('change', () => {
          const n = Number(input.value);
          if (input.value.trim() === '' || !Number.isFinite(n)) {
            input.setAttribute('aria-invalid', 'true');
            return;
          }
          handlers.set(sel, key, n);
        });
        td.append(input);
      }
      tr.append(td);
    }
    const last = el('td');
    if (editable && sel.list === 'waypoints') {
      const del = el('button', { type: 'button', class: 'quiet', 'aria-label': `Remove ${name}` }, 'remove');
      del.addEventListener('click', () => handlers.remove(sel));
      last.append(del);
    }
    tr.append(last);
    body.append(tr);
  };
  const s = doc.route.start;
  row('Start', { list: 'start', index: 0 }, [['x', s.x], ['y', s.y], ['heading', s.heading ?? 0], [null, '']]);
  doc.route.waypoints.forEach((w, i) => {
    row(`Waypoint ${i + 1}`, { list: 'waypoints', index: i }, [['x', w.x], ['y', w.y], ['speed', w.speed], ['dwell', w.dwell ?? 0]]);
  });
  const foot = el('tfoot');
  const tr = el('tr');
  tr.append(el('th', { scope: 'row' }, 'Keep running after the last waypoint'));
  const td = el('td', { colspan: '5' });
  const settle = el('input', { type: 'number', step: 'any', min: '0', 'aria-label': 'settle seconds', id: 'ed-settle' });
  settle.value = doc.route.settle ?? '';
  settle.disabled = !editable;
  settle.addEventListener('change', () => handlers.settle(settle.value.trim() === '' ? undefined : Number(settle.value)));
  td.append(settle, el('span', { class: 'unit' }, ' s'));
  tr.append(td);
  foot.append(tr);
  table.append(head, body, foot);
}

/** Timeline length in seconds: the route's rough duration, stretched to hold every fault. */
export function timelineEnd(doc) {
  const latest = Math.max(0, ...doc.faults.filter((f) => typeof f.at === 'number').map((f) => f.at + 10));
  return Math.max(30, Math.ceil(Math.max(routeTimes(doc).end, latest) / 10) * 10);
}

/** The fault timeline: a marker per timed fault, placed faults listed beside it. */
export function renderTimeline(track, places, doc, pick, editable, handlers) {
  const end = timelineEnd(doc);
  track.replaceChildren();
  track.dataset.end = String(end);
  const step = end > 600 ? 120 : end > 200 ? 30 : 10;
  for (let t = 0; t <= end; t += step) {
    const tick = el('span', { class: 'ed-tick', 'aria-hidden': 'true' }, `${t} s`);
    tick.style.left = `${(t / end) * 100}%`;
    track.append(tick);
  }
  const routeEnd = routeTimes(doc).end;
  const bar = el('span', { class: 'ed-route-span', 'aria-hidden': 'true' });
  bar.style.width = `${Math.min(100, (routeEnd / end) * 100)}%`;
  track.append(bar);
  places.replaceChildren();
  doc.faults.forEach((f, i) => {
    const picked = pick && pick.list === 'faults' && pick.index === i;
    if (typeof f.at === 'number') {
      const m = el('button', {
        type: 'button', role: 'listitem', class: `ed-marker kind-${f.kind}${targetOf(f.kind) ? ' sets-pose' : ''}${picked ? ' picked' : ''}`,
        'aria-label': `${f.kind} ${f.id} at ${f.at} s`, 'data-index': String(i), title: `${f.id}: ${f.kind} at ${f.at} s`,
      });
      m.append(el('span', { class: 'mark' }, faultKind(f.kind)?.mark || '?'), el('span', { class: 'name' }, f.id));
      m.style.left = `${(f.at / end) * 100}%`;
      m.style.top = `${1.4 + (i % 3) * 1.7}rem`;
      m.addEventListener('click', () => handlers.pick(i));
      if (editable) {
        dragMarker(track, m, f, end, i, handlers);
      }
      track.append(m);
    } else {
      const where = f.near ? `near (${f.near.x}, ${f.near.y}) within ${f.near.radius} m` : `on entering ${f.enters}`;
      const b = el('button', { type: 'button', class: `quiet ed-place${picked ? ' picked' : ''}` }, `${f.id}: ${f.kind} ${where}`);
      b.addEventListener('click', () => handlers.pick(i));
      places.append(b);
    }
  });
  if (!doc.faults.length) {
    places.append(el('span', {}, `No faults yet. Kinds: ${faultKinds().kinds.map((k) => k.label).join(', ')}.`));
  }
}

function dragMarker(track, m, f, end, i, handlers) {
  let start = null;
  m.addEventListener('pointerdown', (e) => {
    start = { x: e.clientX, at: f.at, moved: false };
    m.setPointerCapture(e.pointerId);
  });
  m.addEventListener('pointermove', (e) => {
    if (!start) {
      return;
    }
    const w = track.getBoundingClientRect().width || 1;
    const at = Math.max(0, Math.round((start.at + ((e.clientX - start.x) / w) * end) * 10) / 10);
    if (Math.abs(e.clientX - start.x) > 2) {
      start.moved = true;
    }
    m.style.left = `${(at / end) * 100}%`;
    m.dataset.at = String(at);
  });
  m.addEventListener('pointerup', () => {
    if (start && start.moved && m.dataset.at !== undefined) {
      handlers.moveTo(i, Number(m.dataset.at));
    }
    start = null;
  });
  m.addEventListener('keydown', (e) => {
    if (e.key === 'ArrowLeft' || e.key === 'ArrowRight') {
      e.preventDefault();
      e.stopPropagation();
      const d = (e.key === 'ArrowLeft' ? -1 : 1) * (e.shiftKey ? 10 : 1);
      handlers.moveTo(i, Math.max(0, Math.round((f.at + d) * 10) / 10), true);
    }
  });
}

/** The check list; each problem is a button that picks its item. */
export function renderProblems(list, state, problems, onPick) {
  list.replaceChildren();
  const errors = problems.filter((p) => p.severity === 'error').length;
  state.textContent = problems.length === 0 ? 'all fine' : `${errors} error(s), ${problems.length - errors} warning(s)`;
  state.className = `meta ${errors ? 'bad' : 'good'}`;
  for (const p of problems) {
    const li = el('li', { class: p.severity });
    const b = el('button', { type: 'button', class: 'ed-problem', 'data-path': p.path });
    b.append(el('span', { class: 'sev' }, p.severity === 'error' ? '✖ error' : '▲ warning'), ' ', el('code', {}, p.path), ' ', el('span', {}, p.message));
    b.addEventListener('click', () => onPick(p.path));
    li.append(b);
    list.append(li);
  }
}
