import type { Me } from '@shared/schemas/auth';

/**
 * The run sheet as this phone last drew it, shown the moment the app is opened with no connection,
 * before the app itself has started.
 *
 * Starting the app takes the phone about a second (its code compiled, run and drawn); the page
 * itself comes from the service worker in a fraction of that. So the run sheet page keeps what it
 * drew (its own markup and the styles on the page, `keepView`), and `public/kept-view.js`, a small
 * plain script the page runs before the app's code, puts that copy on screen: read-only (`inert`),
 * under a note saying it is the phone's copy and the app is opening. The app takes over when its
 * own run sheet is on screen (`closeKeptView`). Nothing is drawn twice from the data: the copy is
 * the page's own drawing, and the app still decides what the day is.
 *
 * The names below are read by `public/kept-view.js` too: change both together.
 */
export const KEPT_VIEW_KEY = 'furlong.kept-view';
/** The element the script puts the copy in, before `<app-root>`. */
export const KEPT_VIEW_ID = 'furlong-kept-view';
/** On `<html>` while the copy shows: the app draws underneath, out of sight (styles.scss). */
export const KEPT_VIEW_OPEN_CLASS = 'kept-view-open';
/**
 * A copy larger than this is not kept (a long day of pass plans): the browser's storage for the
 * app is about 5 MB, shared with the rest of what the app keeps there.
 */
export const KEPT_VIEW_MAX_CHARS = 1_500_000;

/** Where an element's own style travels in the copy (see `keepView`). */
export const KEPT_STYLE_ATTR = 'data-kept-style';

/** What a `<style>` element inside the markup travels as (see `keepView`). */
export const KEPT_STYLE_ELEMENT = 'furlong-kept-style';

/** What is kept: whose copy it is and when it was drawn, the styles then on the page, the markup. */
export interface KeptView {
  v: 1;
  userId: number;
  farmId: number;
  /** When the copy was drawn (ISO); the script shows it only on the same day at the farm. */
  at: string;
  css: string[];
  html: string;
}

/**
 * Keeps the markup inside `root` (the app's `<app-root>`) and the page's `<style>` elements as the
 * run sheet kept for `me`. A field's typed value is a property, not markup: it is written into the
 * copy as its `value` attribute (a text box's, as its text). A style attribute travels as
 * `data-kept-style`, a `<style>` element as `<furlong-kept-style>`. Loading bars are left out (the
 * copy is not loading). Returns false when nothing was kept (too large, or the browser refused the
 * storage); an older copy is then dropped, so a stale day never shows.
 */
export function keepView(me: Me, root: Element, doc: Document = root.ownerDocument, now = new Date()): boolean {
  const copy = root.cloneNode(true) as Element;
  const typed = root.querySelectorAll('input, textarea');
  copy.querySelectorAll('input, textarea').forEach((field, i) => {
    const value = (typed[i] as HTMLInputElement | HTMLTextAreaElement | undefined)?.value;
    if (value === undefined) return;
    if (field.tagName === 'TEXTAREA') field.textContent = value;
    else field.setAttribute('value', value);
  });
  copy.querySelectorAll('mat-progress-bar').forEach((bar) => bar.remove());
  // The page's policy refuses style attributes in markup (the app sets them through the DOM):
  // they travel as data, and the script sets them through the DOM too.
  copy.querySelectorAll('[style]').forEach((el) => {
    el.setAttribute(KEPT_STYLE_ATTR, el.getAttribute('style') ?? '');
    el.removeAttribute('style');
  });
  // So does a <style> element in markup (an icon's SVG has them): it travels under another name,
  // and the script makes it a <style> again with the page's nonce.
  copy.querySelectorAll('style').forEach((style) => {
    const stand = doc.createElementNS(style.namespaceURI, KEPT_STYLE_ELEMENT);
    stand.textContent = style.textContent;
    style.replaceWith(stand);
  });
  const view: KeptView = {
    v: 1,
    userId: me.user.id,
    farmId: me.farm.id,
    at: now.toISOString(),
    css: [...doc.head.querySelectorAll('style')].map((style) => style.textContent ?? ''),
    html: copy.innerHTML,
  };
  const text = JSON.stringify(view);
  const storage = doc.defaultView?.localStorage;
  try {
    if (text.length > KEPT_VIEW_MAX_CHARS) {
      storage?.removeItem(KEPT_VIEW_KEY);
      return false;
    }
    storage?.setItem(KEPT_VIEW_KEY, text);
    return storage !== undefined;
  } catch {
    // Storage full or refused: no copy, and no older one either.
    try {
      storage?.removeItem(KEPT_VIEW_KEY);
    } catch {
      // Nothing more to do: the app opens as it did before.
    }
    return false;
  }
}

/** Takes the copy off the screen (if `public/kept-view.js` put one there): the app's own page shows. */
export function closeKeptView(doc: Document = document): void {
  doc.getElementById(KEPT_VIEW_ID)?.remove();
  doc.querySelectorAll('style[data-kept-view]').forEach((style) => style.remove());
  doc.documentElement.classList.remove(KEPT_VIEW_OPEN_CLASS);
}
