// Settings (back office, owner): the café, money and tax, units, the bar (wait target, pitchers,
// jug waste), the allergen list, receipts and Pickup. Each section saves on its own; every save
// reaches open Counters, Bars and Pickup boards through the menu.changed event.
import { useSuspenseQuery } from '@tanstack/react-query';
import { Link, type LoaderFunctionArgs } from 'react-router';
import { SCREENS } from '@/domain/screens';
import { StaffMenu } from '@/features/team/staff-menu';
import { AllergensSection } from '@/features/settings/allergens-section';
import { BarSection } from '@/features/settings/bar-section';
import { CafeSection } from '@/features/settings/cafe-section';
import { MoneySection } from '@/features/settings/money-section';
import { PitchersSection } from '@/features/settings/pitchers-section';
import { settingsQuery } from '@/queries/settings';
import { ReceiptsSection } from '@/features/settings/receipts-section';
import { TipsSection } from '@/features/settings/tips-section';
import { UnitsSection } from '@/features/settings/units-section';
import { useApi } from '@/lib/api-context';
import { requireScreen, type RouteDeps } from './deps';

function AdminSettings() {
  const { data: page } = useSuspenseQuery(settingsQuery(useApi()));
  const { settings } = page;
  return (
    <div className="min-h-screen bg-steam-50 text-ink-900">
      <header className="flex flex-wrap items-center gap-x-6 gap-y-2 border-b border-steam-200 px-5 py-3">
        <h1 className="text-3xl font-semibold">Settings</h1>
        <p className="text-lg text-ink-600">{settings.name}</p>
        <Link to="/" reloadDocument className="text-lg font-semibold underline">
          Back to my screen
        </Link>
        <div className="ml-auto">
          <StaffMenu />
        </div>
      </header>
      <main className="mx-auto grid max-w-7xl items-start gap-5 p-5 lg:grid-cols-2">
        <div className="flex flex-col gap-5">
          <CafeSection settings={settings} />
          <MoneySection settings={settings} />
          <TipsSection settings={settings} />
          <UnitsSection page={page} />
          <AllergensSection page={page} />
        </div>
        <div className="flex flex-col gap-5">
          <BarSection settings={settings} />
          <PitchersSection page={page} />
          <ReceiptsSection settings={settings} />
        </div>
      </main>
    </div>
  );
}

export const adminSettingsRoute = (deps: RouteDeps) => ({
  Component: AdminSettings,
  handle: { title: 'Settings' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.adminSettings.need);
    await deps.queryClient.ensureQueryData(settingsQuery(deps.api));
    return null;
  },
});
