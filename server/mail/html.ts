/** Escapes text for use inside HTML e-mail bodies. */
export function esc(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string);
}

/** A plain, readable HTML wrapper shared by every e-mail. */
export function wrapHtml(title: string, inner: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(title)}</title></head>
<body style="font-family:Roboto,Arial,sans-serif;color:#1d2a2e;max-width:640px;margin:0 auto;padding:16px">
<h1 style="font-size:20px">${esc(title)}</h1>${inner}
<p style="color:#5a6a6e;font-size:12px">Sent by Furlong. Furlong's plans are aids: the operator's judgement on the ground comes first.</p>
</body></html>`;
}
