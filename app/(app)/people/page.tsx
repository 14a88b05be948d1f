import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { listInvitations } from '@/lib/people/invitations';
import { listPeople } from '@/lib/people/people';
import { getSettings } from '@/lib/settings/settings';
import { PageTitle } from '@/components/ui/page-title';
import { PeopleTable } from '@/components/people/people-table';
import { InviteForm } from '@/components/people/invite-form';
import { InvitationList } from '@/components/people/invitation-list';

export const metadata = { title: 'People' };

export default async function PeoplePage() {
  const ctx = await requirePageRole('admin');
  const [people, invitations, settings] = await Promise.all([
    listPeople(db, ctx),
    listInvitations(db, ctx),
    getSettings(db, ctx),
  ]);
  return (
    <div className="space-y-5">
      <PageTitle
        title="People"
        lead={`Who uses the bench at ${ctx.spaceName} and what each may do here. Roles and access are per space: switching someone's access off here leaves their other spaces as they are.`}
      />
      <section aria-labelledby="people-heading" className="card">
        <h2 id="people-heading" className="mb-2 text-lg font-bold">
          People in this space ({people.length})
        </h2>
        <PeopleTable people={people} selfId={ctx.userId} />
      </section>
      <div className="grid gap-5 lg:grid-cols-2">
        <section aria-labelledby="invite-heading" className="card">
          <h2 id="invite-heading" className="mb-3 text-lg font-bold">
            Invite someone
          </h2>
          <InviteForm spaceName={ctx.spaceName} />
        </section>
        <section aria-labelledby="invitations-heading" className="card">
          <h2 id="invitations-heading" className="mb-2 text-lg font-bold">
            Waiting invitations
          </h2>
          <InvitationList invitations={invitations} timeZone={settings.timeZone} />
        </section>
      </div>
    </div>
  );
}
