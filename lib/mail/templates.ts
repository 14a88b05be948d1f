import { env } from '@/lib/env';
import { sendMail } from './send';

// Plain, short messages in our own words; every link is absolute so it works from any mail client.
const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

export async function sendSignInLink(user: { email: string; name: string }, token: string): Promise<void> {
  const url = `${env().APP_BASE_URL}/signin/link?token=${encodeURIComponent(token)}`;
  await sendMail({
    to: user.email,
    subject: 'Your Ohmstead sign-in link',
    text: `Hello ${user.name},\n\nOpen this link to sign in to the bench (it works once, for 15 minutes):\n${url}\n\nIf you did not ask for it, ignore this message.`,
    html: `<p>Hello ${esc(user.name)},</p><p><a href="${esc(url)}">Sign in to the bench</a> (works once, for 15 minutes).</p><p>If you did not ask for it, ignore this message.</p>`,
  });
}

export async function sendInvitation(invite: { email: string; name: string; spaceName: string }, token: string): Promise<void> {
  const url = `${env().APP_BASE_URL}/welcome?token=${encodeURIComponent(token)}`;
  await sendMail({
    to: invite.email,
    subject: `You are invited to ${invite.spaceName} on Ohmstead`,
    text: `Hello ${invite.name},\n\nYou have been invited to the electronics bench of ${invite.spaceName}.\nChoose a password here (valid 7 days):\n${url}\n`,
    html: `<p>Hello ${esc(invite.name)},</p><p>You have been invited to the electronics bench of ${esc(invite.spaceName)}.</p><p><a href="${esc(url)}">Choose a password</a> (valid 7 days).</p>`,
  });
}
