import { Card } from '../../../components/ui/card.tsx';
import { PageHeader } from '../../../components/ui/page-header.tsx';
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
        <RaceResultTools />
        <Card title="Fuel planner" description="Not built yet.">
          <p>
            Carbohydrate, fluid and sodium per hour for a long run or a race, and when to take each gel or drink. It will show the
            usual cautions: a physician or a registered dietitian has the last word for you.
          </p>
        </Card>
      </div>
    </>
  );
}
