import { Card } from '../../../components/ui/card.tsx';
import { PageHeader } from '../../../components/ui/page-header.tsx';

const TOOLS = [
  {
    title: 'Pace calculator',
    text: 'Goal time to pace per mile and per kilometre, with even and negative split tables for race day.',
  },
  {
    title: 'Race equivalents',
    text: 'From one result, equivalent times at other distances by Riegel’s formula and by the Daniels & Gilbert equations, side by side, each source named.',
  },
  {
    title: 'Fuel planner',
    text: 'Carbohydrate, fluid and sodium per hour for a long run or a race, and when to take each gel or drink. It shows the usual cautions: a physician or a registered dietitian has the last word for you.',
  },
];

export default function ToolsRoute() {
  return (
    <>
      <PageHeader title="Tools">Calculators for race day and the training that leads to it.</PageHeader>
      <div className="grid gap-4 md:grid-cols-3">
        {TOOLS.map((tool) => (
          <Card key={tool.title} title={tool.title} description="Not built yet.">
            <p>{tool.text}</p>
          </Card>
        ))}
      </div>
    </>
  );
}
