// Edit links opened in this browser. The server never lists edit links (anyone reaching the home
// page could otherwise change every scenario), so the only list of them is the one each browser
// keeps for itself, in localStorage.

const KEY = 'driftlab.editLinks';
const MAX = 50;

function load() {
  try {
    const list = JSON.parse(localStorage.getItem(KEY) || '[]');
    return Array.isArray(list) ? list.filter((e) => e && typeof e.link === 'string' && typeof e.name === 'string') : [];
  } catch (e) {
    // a damaged entry costs the list, not the page
    return [];
  }
}

function save(list) {
  try {
    localStorage.setItem(KEY, JSON.stringify(list.slice(0, MAX)));
  } catch (e) {
    // storage full or switched off: nothing is remembered, the page still works
  }
}

// only links of this server's own shape are kept, so a stored value can never become a script link
function wellFormed(link) {
  return /^\/s\/[A-Za-z0-9_-]+$/.test(link);
}

function remember(marker) {
  const link = marker.dataset.link;
  if (!wellFormed(link)) {
    return;
  }
  const list = load().filter((e) => e.link !== link);
  list.unshift({ link, name: marker.dataset.name || link, at: new Date().toISOString() });
  save(list);
}

function render(target) {
  const list = load().filter((e) => wellFormed(e.link));
  if (list.length === 0) {
    return;
  }
  target.replaceChildren();
  for (const e of list) {
    const li = document.createElement('li');
    const a = document.createElement('a');
    a.href = e.link;
    a.textContent = e.name;
    const forget = document.createElement('button');
    forget.type = 'button';
    forget.className = 'quiet';
    forget.textContent = 'Forget';
    forget.addEventListener('click', () => {
      save(load().filter((x) => x.link !== e.link));
      li.remove();
    });
    li.append(a, ' ', forget);
    target.append(li);
  }
}

const marker = document.getElementById('remember-edit-link');
if (marker) {
  remember(marker);
}
const target = document.getElementById('remembered-edit-links');
if (target) {
  render(target);
}
