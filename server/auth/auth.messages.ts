import type { OutgoingMail } from '../mail/outbox.repository';
import { esc, wrapHtml } from '../mail/html';

export function invitationMail(p: {
  to: string;
  name: string;
  farmId: number;
  farmName: string;
  inviter: string;
  role: string;
  link: string;
  days: number;
}): OutgoingMail {
  const subject = `${p.inviter} invited you to ${p.farmName} on Furlong`;
  const text = `Hello ${p.name},

${p.inviter} invited you to join ${p.farmName} on Furlong as ${p.role}.

Choose your password here (the link works once and expires in ${p.days} days):
${p.link}

If you did not expect this, ignore this e-mail.`;
  const html = wrapHtml(
    subject,
    `<p>Hello ${esc(p.name)},</p><p>${esc(p.inviter)} invited you to join <b>${esc(p.farmName)}</b> on Furlong as <b>${esc(p.role)}</b>.</p>
<p><a href="${esc(p.link)}">Choose your password</a> — the link works once and expires in ${p.days} days.</p><p>If you did not expect this, ignore this e-mail.</p>`,
  );
  return { farmId: p.farmId, kind: 'invite', to: p.to, subject, text, html };
}

export function resetMail(p: { to: string; name: string; link: string; minutes: number }): OutgoingMail {
  const subject = 'Set a new Furlong password';
  const text = `Hello ${p.name},

Someone (we hope you) asked to set a new password for Furlong.
Use this link within ${p.minutes} minutes; it works once:
${p.link}

If you did not ask, ignore this e-mail: your password stays as it is.`;
  const html = wrapHtml(
    subject,
    `<p>Hello ${esc(p.name)},</p><p>Someone (we hope you) asked to set a new password for Furlong.</p>
<p><a href="${esc(p.link)}">Set a new password</a> — within ${p.minutes} minutes; the link works once.</p><p>If you did not ask, ignore this e-mail: your password stays as it is.</p>`,
  );
  return { farmId: null, kind: 'reset', to: p.to, subject, text, html };
}
