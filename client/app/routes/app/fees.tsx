import { useSearchParams } from 'react-router-dom';
import { PageHeader } from '../../../components/ui/page-header.tsx';
import { MyFeesCard } from '../../../features/fees/components/my-fees-card.tsx';

/** Where the payment service sends a runner back to after paying (or not). */
export default function FeesRoute() {
  const [search] = useSearchParams();
  return (
    <>
      <PageHeader title="Fees">
        {search.has('paid')
          ? 'Thank you: the payment went through. The receipt shows here as soon as the payment service confirms it.'
          : 'What your squads charge, and where you stand.'}
      </PageHeader>
      <MyFeesCard />
    </>
  );
}
