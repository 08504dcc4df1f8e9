// A work order as e-mail, in plain text and HTML with the same content. Every order carries the
// operation's cautions, which defer to local law and licensed practice.
import type { OutgoingMail } from '../mail/outbox.repository';
import { esc, wrapHtml } from '../mail/html';
import type { OrderContent, OrderHazard, OrderJob } from './work-order.content';

const hazardLine = (h: OrderHazard) =>
  `${h.label}: keep ${h.clearanceFt} ft (${h.clearanceM} m) clear${h.note ? `. ${h.note}` : ''}${h.reported ? ' (reported, not yet confirmed)' : ''}`;

const planLine = (p: NonNullable<OrderJob['passPlan']>) =>
  [
    p.headingDeg != null ? `heading ${Math.round(p.headingDeg)}°` : null,
    p.passCount != null ? `${p.passCount} passes` : null,
    `${p.headlandPasses} headland passes`,
  ]
    .filter(Boolean)
    .join(', ');

function jobText(j: OrderJob, i: number): string {
  const lines = [
    `${i + 1}. ${j.field}: ${j.operation}, ${j.start}–${j.end}, ${j.acresPlanned} ac, ${j.hours} h planned`,
    j.doesNotFit ? `   Warning: ${j.doesNotFit}. Ask the owner before you start.` : null,
    j.role === 'mentor' ? `   You mentor ${j.operator} on this job.` : j.mentor ? `   Mentor: ${j.mentor}` : null,
    `   Machine: ${j.machine}`,
    `   Implement: ${j.implement} (${j.widthFt} ft)`,
    j.passPlan ? `   Pass plan: ${planLine(j.passPlan)}` : '   Pass plan: none saved',
    j.hazards.length ? `   Hazards:\n${j.hazards.map((h) => `   - ${hazardLine(h)}`).join('\n')}` : '   Hazards: none marked',
    j.note ? `   Note: ${j.note}` : null,
  ];
  return lines.filter((l) => l !== null).join('\n');
}

function jobHtml(j: OrderJob): string {
  const row = (k: string, v: string) =>
    `<tr><th style="text-align:left;padding-right:8px;vertical-align:top">${esc(k)}</th><td>${v}</td></tr>`;
  return `<li style="margin-bottom:12px"><strong>${esc(j.field)}</strong>: ${esc(j.operation)}, ${esc(j.start)}–${esc(j.end)}, ${j.acresPlanned} ac, ${j.hours} h planned
<table style="font-size:14px">${[
    j.doesNotFit ? row('Warning', `${esc(j.doesNotFit)}. Ask the owner before you start.`) : '',
    j.role === 'mentor' ? row('Mentoring', esc(j.operator)) : j.mentor ? row('Mentor', esc(j.mentor)) : '',
    row('Machine', esc(j.machine)),
    row('Implement', `${esc(j.implement)} (${j.widthFt} ft)`),
    row('Pass plan', j.passPlan ? esc(planLine(j.passPlan)) : 'none saved'),
    row('Hazards', j.hazards.length ? `<ul>${j.hazards.map((h) => `<li>${esc(hazardLine(h))}</li>`).join('')}</ul>` : 'none marked'),
    j.note ? row('Note', esc(j.note)) : '',
  ].join('')}</table></li>`;
}

export function workOrderMail(c: OrderContent, to: string, farmId: number, membershipId: number): OutgoingMail {
  const subject = `Work order for ${c.dateLabel} (${c.farm})`;
  const cautions = c.cautions.map((k) => `${k.operation}:\n${k.lines.map((l) => `- ${l}`).join('\n')}`).join('\n\n');
  const text = [
    `Hello ${c.name},`,
    `Your jobs on ${c.dateLabel} at ${c.farm}, in running order:`,
    c.jobs.map(jobText).join('\n\n'),
    `Cautions (they defer to local law and licensed practice; your judgement on the ground comes first):\n${cautions}`,
    `Your run sheet: ${c.link}`,
  ].join('\n\n');
  const html = wrapHtml(
    subject,
    `<p>Hello ${esc(c.name)},</p><p>Your jobs on ${esc(c.dateLabel)} at ${esc(c.farm)}, in running order:</p>
<ol>${c.jobs.map(jobHtml).join('')}</ol>
<h2 style="font-size:16px">Cautions</h2><p>They defer to local law and licensed practice; your judgement on the ground comes first.</p>
${c.cautions.map((k) => `<h3 style="font-size:14px">${esc(k.operation)}</h3><ul>${k.lines.map((l) => `<li>${esc(l)}</li>`).join('')}</ul>`).join('')}
<p><a href="${esc(c.link)}">Open your run sheet</a> (${esc(c.link)})</p>`,
  );
  return { farmId, kind: 'work-order', ref: `board:${c.date}:${membershipId}`, to, subject, text, html };
}

/** Tells someone who had jobs when the board was last published that they now have none that day. */
export function withdrawalMail(
  p: { name: string; farm: string; date: string; dateLabel: string; link: string },
  to: string,
  farmId: number,
  membershipId: number,
): OutgoingMail {
  const subject = `No jobs for you on ${p.dateLabel} (${p.farm})`;
  const text = `Hello ${p.name},\n\nThe work board for ${p.dateLabel} at ${p.farm} changed: you no longer have jobs that day. The work order you had for that day is withdrawn.\n\nYour run sheet: ${p.link}`;
  const html = wrapHtml(
    subject,
    `<p>Hello ${esc(p.name)},</p><p>The work board for ${esc(p.dateLabel)} at ${esc(p.farm)} changed: you no longer have jobs that day. The work order you had for that day is withdrawn.</p><p><a href="${esc(p.link)}">Open your run sheet</a></p>`,
  );
  return { farmId, kind: 'work-order', ref: `board:${p.date}:${membershipId}`, to, subject, text, html };
}
