import Link from 'next/link';
import { db } from '@/db';
import { AppHeader } from '@/components/shell/app-header';
import { AcceptForExisting, WelcomeForm } from '@/components/people/welcome-form';
import { findOpenInvitation } from '@/lib/people/invitations';
import { invitationTokenSchema, ROLE_WORDS } from '@/lib/people/schema';

export const metadata = { title: 'Welcome' };

// Public: the invitation link's token is the credential. Opening the page uses nothing up; only
// submitting the form does, so mail scanners that fetch links cannot spend the invitation.
export default async function WelcomePage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token } = await searchParams;
  const parsed = invitationTokenSchema.safeParse(token);
  const invitation = parsed.success ? await findOpenInvitation(db, parsed.data) : null;
  return (
    <>
      <AppHeader ctx={null} />
      <main className="mx-auto max-w-md px-4 py-10">
        {!parsed.success || !invitation ? (
          <>
            <h1 className="text-2xl font-bold">This invitation cannot be used</h1>
            <p className="mt-3">
              The link is incomplete, has been used already, was withdrawn, or has expired. Ask an admin of
              the space for a new invitation.
            </p>
            <p className="mt-3">
              Already have an account? <Link href="/signin">Sign in</Link>.
            </p>
          </>
        ) : (
          <>
            <h1 className="text-2xl font-bold">Welcome to {invitation.spaceName}</h1>
            <p className="muted mt-1">
              You are invited as{' '}
              {invitation.roles
                .map((r) => ROLE_WORDS[r])
                .join(', ')
                .toLowerCase()}{' '}
              with <strong className="break-all">{invitation.email}</strong>.
            </p>
            {invitation.existingAccount ? (
              <>
                <p className="mt-3">
                  You already have an Ohmstead account with this e-mail. Accepting adds {invitation.spaceName}{' '}
                  to your spaces; you keep signing in with your current password.
                </p>
                <AcceptForExisting token={parsed.data} spaceName={invitation.spaceName} />
              </>
            ) : (
              <WelcomeForm token={parsed.data} email={invitation.email} name={invitation.name} />
            )}
          </>
        )}
      </main>
    </>
  );
}
