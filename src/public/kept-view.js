// The run sheet as this phone last drew it, on screen the moment the app is opened with no
// connection, before the app's own code has started (which takes the phone about a second). The
// run sheet page keeps the copy (src/app/core/offline/kept-view.ts: its names are the same as
// here); this script only puts it back: read-only, under a note that it is the phone's copy and
// the app is opening. The app takes it away when its own run sheet is on screen.
// It shows only for the run sheet's own day (no ?date or ?person), with no connection, for the
// person last signed in on this phone, drawn the same day at the farm. Anything else (no copy,
// storage refused, a copy that does not read) leaves the page as it was: the app opens as usual.
// Plain JavaScript, run as the page is read: the build copies it as it is.
/* global document, location, navigator, localStorage */
(function () {
  'use strict';
  var KEPT_VIEW_KEY = 'furlong.kept-view';
  var KEPT_VIEW_ID = 'furlong-kept-view';
  var KEPT_VIEW_OPEN_CLASS = 'kept-view-open';
  var KEPT_STYLE_ATTR = 'data-kept-style';
  var KEPT_STYLE_ELEMENT = 'furlong-kept-style';
  var SIGNED_IN_KEY = 'furlong.signed-in';
  var THEME_KEY = 'furlong.theme';
  // Nothing that could act goes back on the page, whatever the storage holds: only markup as the
  // app draws it. (The page's policy refuses scripts and handlers as well; these would still act.)
  var DROPPED = 'script, iframe, frame, object, embed, meta, base, link, form, style, noscript, template';
  var LINKS = ['href', 'src', 'xlink:href', 'action', 'formaction'];
  // Should the app not start at all, the copy still gives way after this long.
  var GIVE_WAY_MS = 15000;

  function close() {
    var box = document.getElementById(KEPT_VIEW_ID);
    if (box) box.remove();
    document.querySelectorAll('style[data-kept-view]').forEach(function (s) {
      s.remove();
    });
    document.documentElement.classList.remove(KEPT_VIEW_OPEN_CLASS);
  }

  try {
    if (location.pathname !== '/run-sheet' || location.search || navigator.onLine !== false) return;
    var me = JSON.parse(localStorage.getItem(SIGNED_IN_KEY) || 'null');
    var view = JSON.parse(localStorage.getItem(KEPT_VIEW_KEY) || 'null');
    if (!me || !me.user || !me.farm || !view || view.v !== 1) return;
    if (view.userId !== me.user.id || view.farmId !== me.farm.id || typeof view.html !== 'string') return;
    var zone = me.farm.timeZone || undefined;
    var drawn = new Date(view.at);
    var day = new Intl.DateTimeFormat('en-CA', { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit' });
    if (isNaN(drawn.getTime()) || day.format(drawn) !== day.format(new Date())) return;
    var clock = new Intl.DateTimeFormat('en-GB', { timeZone: zone, hour: '2-digit', minute: '2-digit', hourCycle: 'h23' });

    var appRoot = document.querySelector('app-root');
    // The page's policy admits styles with this page's nonce only (the server writes it here).
    var nonce = appRoot ? appRoot.getAttribute('ngCspNonce') : null;
    (Array.isArray(view.css) ? view.css : []).forEach(function (css) {
      var style = document.createElement('style');
      if (nonce) style.nonce = nonce;
      style.setAttribute('data-kept-view', '');
      style.textContent = String(css);
      document.head.appendChild(style);
    });
    // The theme the person picked (as the app's ThemeStore reads it); without one the system's applies.
    var theme = localStorage.getItem(THEME_KEY);
    if (theme === 'dark' || theme === 'light') document.documentElement.classList.add(theme + '-theme');

    var box = document.createElement('div');
    box.id = KEPT_VIEW_ID;
    // It scrolls (a long day): a region the keyboard can reach and scroll.
    box.setAttribute('role', 'region');
    box.setAttribute('aria-label', 'Run sheet kept on this phone');
    box.tabIndex = 0;
    var note = document.createElement('p');
    note.className = 'kept-view-note';
    note.setAttribute('role', 'status');
    note.setAttribute('data-kept-view-note', '');
    note.textContent = 'Opening: the run sheet kept on this phone, as of ' + clock.format(drawn) + '.';
    var copy = document.createElement('div');
    copy.className = 'kept-view-copy';
    // Seen, not used: nothing on it answers a tap, and screen readers hear the note only.
    copy.setAttribute('inert', '');
    // Read in an inert template first: nothing in it loads or runs until it is cleaned.
    var template = document.createElement('template');
    template.innerHTML = view.html;
    template.content.querySelectorAll(DROPPED).forEach(function (el) {
      el.remove();
    });
    template.content.querySelectorAll('*').forEach(function (el) {
      Array.prototype.slice.call(el.attributes).forEach(function (a) {
        var name = a.name.toLowerCase();
        var script = LINKS.indexOf(name) !== -1 && /^\s*javascript:/i.test(a.value);
        if (name.indexOf('on') === 0 || name === 'style' || script) el.removeAttribute(a.name);
      });
    });
    copy.appendChild(template.content);
    // Style attributes in markup are refused by the page's policy; set through the DOM they apply.
    copy.querySelectorAll('[' + KEPT_STYLE_ATTR + ']').forEach(function (el) {
      el.style.cssText = el.getAttribute(KEPT_STYLE_ATTR);
      el.removeAttribute(KEPT_STYLE_ATTR);
    });
    // And so are <style> elements in markup (an icon's SVG has them): made again, with the nonce.
    copy.querySelectorAll(KEPT_STYLE_ELEMENT).forEach(function (stand) {
      var style = document.createElementNS(stand.namespaceURI, 'style');
      if (nonce) style.nonce = nonce;
      style.textContent = stand.textContent;
      stand.replaceWith(style);
    });
    box.appendChild(note);
    box.appendChild(copy);
    document.body.insertBefore(box, appRoot);
    document.documentElement.classList.add(KEPT_VIEW_OPEN_CLASS);
    setTimeout(close, GIVE_WAY_MS);
  } catch {
    close();
  }
})();
