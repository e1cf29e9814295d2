import { Card } from '../../../components/ui/card.tsx';
import { LinkButton } from '../../../components/ui/link-button.tsx';
import { PageHeader } from '../../../components/ui/page-header.tsx';
import { paths } from '../../../config/paths.ts';
import { useProfile } from '../../../features/profile/api/get-profile.ts';
import { PaceCalculator } from '../../../features/tools/components/pace-calculator.tsx';
import { RaceResultTools } from '../../../features/tools/components/race-result-tools.tsx';

export default function ToolsRoute() {
  const profile = useProfile();
  return (
    <>
      <PageHeader title="Tools">Calculators for race day and the training that leads to it.</PageHeader>
      <div className="grid gap-4">
        <PaceCalculator defaultUnit={profile.unit} />
        <RaceResultTools unit={profile.unit} />
        <Card title="Fuel planner" description="Fuel items, and fuel plans for long runs and your goal race.">
          <p className="mb-3">
            Carbohydrate, fluid and sodium per hour for a long run or a race, and when to take each gel or drink, by distance and
            clock. The usual cautions come with the numbers: a physician, a registered dietitian or a qualified coach has the last
            word for you.
          </p>
          <div className="flex flex-wrap gap-2">
            <LinkButton to={paths.fuel.getHref()}>Fuel items</LinkButton>
            <LinkButton to={paths.goalFuel.getHref()}>Race fuel plan</LinkButton>
          </div>
        </Card>
      </div>
    </>
  );
}
