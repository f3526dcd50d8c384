// The plan in words: a text alternative for the canvas, the list of the site's items (each one a
// button that picks it) and the "Add by coordinates" forms, so everything the pointer can place
// can also be placed from the keyboard.
import { rect } from './model.js';
import { $, doc, editable, hooks, state } from './store.js';
import { addDoor, addOutline, addWaypoint } from './tools.js';

const LISTS = [
  ['rooms', 'Room', 'rooms'],
  ['doors', 'Door', 'doors'],
  ['fixtures', 'Fixture', 'fixtures'],
  ['floorZones', 'Floor zone', 'floor zones'],
  ['clutter', 'Clutter', 'clutter items'],
];

const m = (v) => Number(v).toFixed(2);

function itemLabel(list, word, item) {
  const name = item.name && item.name !== item.id ? `${item.name} (${item.id})` : item.id;
  if (list === 'doors') {
    return `${word} ${name} on ${item.room} wall ${item.wall}, ${m(item.along)} m along, ${m(item.width)} m wide, mapped ${item.mapped}, actually ${item.actual}`;
  }
  return `${word} ${name}, ${item.outline.length} corners`;
}

/** One sentence for the canvas's description: what the plan holds. */
export function describePlan() {
  const counts = LISTS.map(([list, , plural]) => `${doc.site[list].length} ${plural}`).join(', ');
  const s = doc.route.start;
  const start = `start at x ${m(s.x)} m, y ${m(s.y)} m, heading ${Number(s.heading || 0)} deg`;
  return `Site plan with ${counts}; ${start}; ${doc.route.waypoints.length} waypoints; ${doc.faults.length} faults. `
    + 'The items are listed under Items, the route under Route.';
}

function button(text, sel) {
  const b = document.createElement('button');
  b.type = 'button';
  b.className = 'linkish';
  b.textContent = text;
  const picked = state.pick && state.pick.list === sel.list && state.pick.index === sel.index;
  b.setAttribute('aria-pressed', String(Boolean(picked)));
  b.dataset.list = sel.list;
  b.dataset.index = String(sel.index);
  b.addEventListener('click', () => hooks.pick(sel));
  const li = document.createElement('li');
  li.append(b);
  return li;
}

/** Rebuilds the item list and the canvas description. */
export function renderItems() {
  $('ed-plan-desc').textContent = describePlan();
  const host = $('ed-items');
  host.replaceChildren();
  for (const [list, word] of LISTS) {
    doc.site[list].forEach((item, i) => host.append(button(itemLabel(list, word, item), { list, index: i })));
  }
  const s = doc.route.start;
  host.append(button(`Start at x ${m(s.x)} m, y ${m(s.y)} m`, { list: 'start', index: 0 }));
  doc.route.waypoints.forEach((w, i) => host.append(button(`Waypoint ${i + 1} at x ${m(w.x)} m, y ${m(w.y)} m, ${w.speed} m/s`, { list: 'waypoints', index: i })));
  const rooms = $('ed-add-door-room');
  if (rooms) {
    const keep = rooms.value;
    rooms.replaceChildren(...doc.site.rooms.map((r) => new Option(r.name ? `${r.name} (${r.id})` : r.id, r.id)));
    if (doc.site.rooms.some((r) => r.id === keep)) {
      rooms.value = keep;
    }
  }
}

function num(id) {
  const input = $(id);
  const n = Number(input.value);
  const ok = input.value.trim() !== '' && Number.isFinite(n);
  input.setAttribute('aria-invalid', String(!ok));
  return ok ? n : null;
}

function say(text) {
  $('ed-add-msg').textContent = text;
}

function addOutlineFromForm(e) {
  e.preventDefault();
  const [x0, y0, x1, y1] = ['ed-add-x0', 'ed-add-y0', 'ed-add-x1', 'ed-add-y1'].map(num);
  if ([x0, y0, x1, y1].includes(null)) {
    say('Not added: every corner needs a number.');
    return;
  }
  if (Math.abs(x1 - x0) < 0.01 || Math.abs(y1 - y0) < 0.01) {
    say('Not added: the corners must differ in x and in y.');
    return;
  }
  const kind = $('ed-add-kind');
  addOutline(kind.value, rect(x0, y0, x1, y1));
  say(`${kind.options[kind.selectedIndex].text} added from (${x0}, ${y0}) to (${x1}, ${y1}).`);
}

function addDoorFromForm(e) {
  e.preventDefault();
  const room = doc.site.rooms.find((r) => r.id === $('ed-add-door-room').value);
  const [wall, along, width] = ['ed-add-door-wall', 'ed-add-door-along', 'ed-add-door-width'].map(num);
  if (!room) {
    say('Not added: a door needs a room; add one first.');
    return;
  }
  if (wall === null || along === null || width === null || !Number.isInteger(wall) || wall < 0 || wall >= room.outline.length) {
    say(`Not added: the wall is a whole number from 0 to ${room.outline.length - 1}, position and width are numbers.`);
    return;
  }
  addDoor(room.id, wall, along, width);
  say(`Door added on ${room.id} wall ${wall}.`);
}

function addWaypointFromForm(e) {
  e.preventDefault();
  const [x, y, speed] = ['ed-add-wx', 'ed-add-wy', 'ed-add-wspeed'].map(num);
  if (x === null || y === null || speed === null || speed <= 0) {
    say('Not added: x and y are numbers, the speed is above 0.');
    return;
  }
  addWaypoint(x, y, speed);
  say(`Waypoint ${doc.route.waypoints.length} added at (${x}, ${y}).`);
}

export function wireItems() {
  if (!editable || !$('ed-add-outline')) {
    return;
  }
  $('ed-add-outline').addEventListener('submit', addOutlineFromForm);
  $('ed-add-door').addEventListener('submit', addDoorFromForm);
  $('ed-add-waypoint').addEventListener('submit', addWaypointFromForm);
}
