// The mail that carries an invitation or a reset link (plain text and HTML).
import type { LinkPurpose } from '@/domain/team-schemas';
import { LINK_HOURS } from '@/domain/team-schemas';
import { escapeHtml } from '@/domain/html';

export interface LinkMailInput {
  purpose: LinkPurpose;
  personName: string;
  username: string;
  role: string;
  locationName: string;
  senderName: string;
  link: string;
}

const firstName = (name: string) => name.trim().split(/\s+/)[0] ?? name;

export function linkMail(m: LinkMailInput): { subject: string; text: string; html: string } {
  const invite = m.purpose === 'invite';
  const subject = invite ? `Your Jugline sign-in at ${m.locationName}` : `Choose a new Jugline password for ${m.locationName}`;
  const opening = invite
    ? `${m.senderName} added you to Jugline at ${m.locationName} as ${m.role === 'owner' ? 'an' : 'a'} ${m.role}.`
    : `${m.senderName} sent you a link to choose a new password for Jugline at ${m.locationName}.`;
  const action = invite ? 'Set your password here' : 'Choose your new password here';
  const closing = invite
    ? "If you didn't expect this, ignore this mail: nothing happens until the link is used."
    : `Your current password keeps working until you choose a new one. If you didn't ask for this, tell ${firstName(m.senderName)}.`;
  const validity = `The link works once, for ${LINK_HOURS} hours.`;

  const text = [
    `Hello ${firstName(m.personName)},`,
    '',
    opening,
    `Your sign-in name: ${m.username}`,
    '',
    `${action} (${validity.toLowerCase().replace(/\.$/, '')}):`,
    m.link,
    '',
    closing,
    '',
  ].join('\n');

  const e = escapeHtml;
  const html =
    `<!doctype html><html lang="en"><body style="margin:0;background:#fbfaf7;color:#1d1a17;font-family:Helvetica,Arial,sans-serif">` +
    `<div style="max-width:480px;margin:0 auto;padding:24px">` +
    `<h1 style="margin:0;font-size:24px">${e(m.locationName)}</h1>` +
    `<p style="margin:16px 0 0">Hello ${e(firstName(m.personName))},</p>` +
    `<p style="margin:8px 0 0">${e(opening)}</p>` +
    `<p style="margin:8px 0 0">Your sign-in name: <strong>${e(m.username)}</strong></p>` +
    `<p style="margin:20px 0"><a href="${e(m.link)}" style="display:inline-block;background:#8f4d1f;color:#fbfaf7;padding:12px 20px;border-radius:8px;font-weight:700;text-decoration:none">${e(action)}</a></p>` +
    `<p style="margin:0;color:#5a5047">${e(validity)} If the button does not work, copy this address:<br>${e(m.link)}</p>` +
    `<p style="margin:16px 0 0;color:#5a5047">${e(closing)}</p>` +
    `</div></body></html>`;
  return { subject, text, html };
}
