import Link from 'next/link';
import { db } from '@/db';
import { requirePageRole } from '@/lib/auth/guard';
import { getSettings } from '@/lib/settings/settings';
import { CURRENCIES, TIME_ZONES } from '@/lib/settings/schema';
import { PageTitle } from '@/components/ui/page-title';
import { SettingsForm } from '@/components/settings/settings-form';
import { DeploymentNotes } from '@/components/settings/deployment-notes';
import { env } from '@/lib/env';
import { APP_VERSION } from '@/lib/version';
import { lastBackups } from '@/lib/backup/run';
import { BorrowingRulesForm } from '@/components/settings/borrowing-rules-form';
import { borrowingRules } from '@/lib/rules/settings';
import { MoneyRulesForm } from '@/components/settings/money-rules-form';
import { moneyRules } from '@/lib/money-rules/settings';

export const metadata = { title: 'Settings' };

export default async function SettingsPage() {
  const ctx = await requirePageRole('admin');
  const [settings, rules, money] = await Promise.all([
    getSettings(db, ctx),
    borrowingRules(db, ctx.spaceId),
    moneyRules(db, ctx.spaceId),
  ]);
  return (
    <div className="mx-auto max-w-3xl">
      <PageTitle title="Settings" lead={`The rules ${ctx.spaceName} runs its bench by.`}>
        <Link className="btn-quiet" href="/settings/api">
          API reference
        </Link>
      </PageTitle>
      <SettingsForm initial={settings} timeZones={TIME_ZONES} currencies={CURRENCIES} />
      <DeploymentNotes baseUrl={env().APP_BASE_URL} version={APP_VERSION} backups={await lastBackups(db)} />
      <h2 className="mt-10 mb-3 text-xl font-bold">Borrowing rules</h2>
      <BorrowingRulesForm initial={rules} closingTime={settings.closingTime} currency={settings.currency} />
      <h2 className="mt-10 mb-3 text-xl font-bold">Money: tax, card payments, account codes</h2>
      <MoneyRulesForm initial={money} currency={settings.currency} />
    </div>
  );
}
