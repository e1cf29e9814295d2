import type { QueryClient } from '@tanstack/react-query';
import { Card } from '../../../components/ui/card.tsx';
import { LinkButton } from '../../../components/ui/link-button.tsx';
import { PageHeader } from '../../../components/ui/page-header.tsx';
import { paths } from '../../../config/paths.ts';
import { fuelItemsQueryOptions } from '../../../features/fuel/api/get-fuel-items.ts';
import { FuelItemsCard } from '../../../features/fuel/components/fuel-items-card.tsx';

export const createLoader = (queryClient: QueryClient) => async () => {
  await queryClient.ensureQueryData(fuelItemsQueryOptions());
  return null;
};

export default function FuelRoute() {
  return (
    <>
      <PageHeader title="Fuel">
        Your fuel items, and the fuel plans that place them by distance and clock on a long run or a race.
      </PageHeader>
      <div className="grid gap-4">
        <FuelItemsCard />
        <Card title="Fuel plans" description="A fuel plan belongs to one session plan or to your goal race.">
          <p className="mb-3 text-sm">
            Open a session on the Plan page and choose “Fuel plan”, or plan race day from your goal race. The plan proposes
            carbohydrate, fluid and sodium per hour with their sources, places every intake by mile, kilometre and clock, and
            prints a sheet for the night before.
          </p>
          <div className="flex flex-wrap gap-2">
            <LinkButton to={paths.plan.getHref()}>Plan page</LinkButton>
            <LinkButton to={paths.goalFuel.getHref()}>Race fuel plan</LinkButton>
          </div>
        </Card>
      </div>
    </>
  );
}
