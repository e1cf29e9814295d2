import { EmptyState } from '../../../components/ui/empty-state.tsx';
import { PageHeader } from '../../../components/ui/page-header.tsx';

export default function PlanRoute() {
  return (
    <>
      <PageHeader title="Plan">Your goal race and the session plans that lead to it.</PageHeader>
      <EmptyState title="No goal race or session plans yet.">
        <p>
          Writing plans arrives with the plan feature. You will set a goal race (date, distance, goal time) and write each session
          as parts, for example “2 mi warm-up, 5 × 1 km at 3:50–3:55 /km with 400 m jog, 2 mi cool-down”.
        </p>
        <p>
          Every run on a planned day then gets a plan check, part by part, with a verdict in words and a glyph: ● on pace, ▲
          quick, ▼ slow, ◐ cut short or extended.
        </p>
      </EmptyState>
    </>
  );
}
