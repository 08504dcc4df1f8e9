// A work order as e-mail, in plain text and HTML with the same content. Every order carries the
// operation's cautions, which defer to local law and licensed practice.
import { DateTime } from 'luxon';
import { dayClock, zoneAbbreviation } from '../../shared/farm-time';
import type { OutgoingMail } from '../mail/outbox.repository';
import { esc, wrapHtml } from '../mail/html';
import { formatArea, formatHours, formatLength, formatPassHeading, formatWidth } from '../../shared/figures';
import type { UnitSystem } from '../../shared/schemas/auth';
import { parseTime } from './clock';
import type { OrderContent, OrderHazard, OrderJob, OrderWarnings } from './work-order.content';

/** The instant a board time ('HH:MM', past 24:00 for the next morning) names on a day at the farm. */
function instantOf(day: string, hhmm: string, timeZone: string): Date {
  const min = parseTime(hhmm);
  return DateTime.fromISO(day, { zone: timeZone })
    .startOf('day')
    .plus({ days: Math.floor(min / 1440) })
    .set({ hour: Math.floor((min % 1440) / 60), minute: min % 60 })
    .toJSDate();
}

/**
 * A job's times with the farm's zone, for a reader whose own clock may be set elsewhere:
 * '07:00–15:00 CDT'; each end keeps its own on the night the clocks change ('01:00 CST–06:00 CDT').
 */
export function timesOf(j: Pick<OrderJob, 'start' | 'end'>, day: string, timeZone: string): string {
  const from = zoneAbbreviation(timeZone, instantOf(day, j.start, timeZone));
  const to = zoneAbbreviation(timeZone, instantOf(day, j.end, timeZone));
  // A job running on past midnight: its end is the next day's clock ('01:43 next day'), not '25:43'.
  const [start, end] = [dayClock(j.start), dayClock(j.end)];
  return from === to ? `${start}–${end} ${to}` : `${start} ${from}–${end} ${to}`;
}

/** "Rock: keep 10 ft clear": the clearance as the run sheet and the field map write it. */
const hazardLine = (h: OrderHazard, units: UnitSystem) =>
  `${h.label}: keep ${formatLength(h.clearanceM, units)} clear${h.note ? `. ${h.note}` : ''}${h.reported ? ' (reported, not yet confirmed)' : ''}`;

const planLine = (p: NonNullable<OrderJob['passPlan']>) =>
  [
    p.headingDeg != null ? `heading ${formatPassHeading(p.headingDeg)}` : null,
    p.passCount != null ? `${p.passCount} passes` : null,
    `${p.headlandPasses} headland passes`,
  ]
    .filter(Boolean)
    .join(', ');

/** "822.7 ac, 5.4 h planned": the figures as the board's card writes them. */
const workLine = (j: OrderJob, units: UnitSystem) => `${formatArea(j.acresPlanned, units)}, ${formatHours(j.hours)} planned`;

/** A board warning as a sentence: "… this season." */
const sentence = (w: string) => (/[.!?]$/.test(w) ? w : `${w}.`);
const ASK = 'Ask the owner before you start; your judgement on the ground comes first.';

function jobText(j: OrderJob, i: number, times: string, units: UnitSystem, warnings: readonly string[]): string {
  const lines = [
    `${i + 1}. ${j.field}: ${j.operation}, ${times}, ${workLine(j, units)}`,
    j.doesNotFit ? `   Warning: ${j.doesNotFit}. Ask the owner before you start.` : null,
    ...warnings.map((w) => `   Warning: ${sentence(w)}`),
    warnings.length ? `   ${ASK}` : null,
    j.role === 'mentor' ? `   You mentor ${j.operator} on this job.` : j.mentor ? `   Mentor: ${j.mentor}` : null,
    `   Machine: ${j.machine}`,
    `   Implement: ${j.implement} (${formatWidth(j.widthM, units)})`,
    j.passPlan ? `   Pass plan: ${planLine(j.passPlan)}` : '   Pass plan: none saved',
    j.hazards.length ? `   Hazards:\n${j.hazards.map((h) => `   - ${hazardLine(h, units)}`).join('\n')}` : '   Hazards: none marked',
    j.note ? `   Note: ${j.note}` : null,
  ];
  return lines.filter((l) => l !== null).join('\n');
}

function jobHtml(j: OrderJob, times: string, units: UnitSystem, warnings: readonly string[]): string {
  const row = (k: string, v: string) =>
    `<tr><th style="text-align:left;padding-right:8px;vertical-align:top">${esc(k)}</th><td>${v}</td></tr>`;
  return `<li style="margin-bottom:12px"><strong>${esc(j.field)}</strong>: ${esc(j.operation)}, ${esc(times)}, ${esc(workLine(j, units))}
<table style="font-size:14px">${[
    j.doesNotFit ? row('Warning', `${esc(j.doesNotFit)}. Ask the owner before you start.`) : '',
    ...warnings.map((w) => row('Warning', esc(sentence(w)))),
    warnings.length ? row('', esc(ASK)) : '',
    j.role === 'mentor' ? row('Mentoring', esc(j.operator)) : j.mentor ? row('Mentor', esc(j.mentor)) : '',
    row('Machine', esc(j.machine)),
    row('Implement', `${esc(j.implement)} (${esc(formatWidth(j.widthM, units))})`),
    row('Pass plan', j.passPlan ? esc(planLine(j.passPlan)) : 'none saved'),
    row('Hazards', j.hazards.length ? `<ul>${j.hazards.map((h) => `<li>${esc(hazardLine(h, units))}</li>`).join('')}</ul>` : 'none marked'),
    j.note ? row('Note', esc(j.note)) : '',
  ].join('')}</table></li>`;
}

/**
 * `timeZone`: the farm's (IANA); the order's times are its clock, and say so. `warnings`: the
 * board's warnings standing when it was published (`orderWarnings`), repeated where they apply.
 */
export function workOrderMail(
  c: OrderContent,
  to: string,
  farmId: number,
  membershipId: number,
  timeZone: string,
  warnings: OrderWarnings = { day: [], jobs: [] },
): OutgoingMail {
  const times = c.jobs.map((j) => timesOf(j, c.date, timeZone));
  const jobWarnings = (i: number) => warnings.jobs[i] ?? [];
  const dayText = warnings.day.map((w) => `Warning for the day: ${sentence(w)} ${ASK}`);
  const dayHtml = warnings.day.map((w) => `<p><strong>Warning for the day:</strong> ${esc(sentence(w))} ${esc(ASK)}</p>`).join('');
  const subject = `Work order for ${c.dateLabel} (${c.farm})`;
  const cautions = c.cautions.map((k) => `${k.operation}:\n${k.lines.map((l) => `- ${l}`).join('\n')}`).join('\n\n');
  const text = [
    `Hello ${c.name},`,
    ...dayText,
    `Your jobs on ${c.dateLabel} at ${c.farm}, in running order:`,
    c.jobs.map((j, i) => jobText(j, i, times[i], c.units, jobWarnings(i))).join('\n\n'),
    `Cautions (they defer to local law and licensed practice; your judgement on the ground comes first):\n${cautions}`,
    `Your run sheet: ${c.link}`,
  ].join('\n\n');
  const html = wrapHtml(
    subject,
    `<p>Hello ${esc(c.name)},</p>${dayHtml}<p>Your jobs on ${esc(c.dateLabel)} at ${esc(c.farm)}, in running order:</p>
<ol>${c.jobs.map((j, i) => jobHtml(j, times[i], c.units, jobWarnings(i))).join('')}</ol>
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
