import { EmptyState } from '../../../components/ui/empty-state.tsx';
import { LinkButton } from '../../../components/ui/link-button.tsx';
import { PageHeader } from '../../../components/ui/page-header.tsx';
import { paths } from '../../../config/paths.ts';

export default function LogRoute() {
  return (
    <>
      <PageHeader title="Log">Your runs, split by mile and by kilometre, and a month of them at a glance.</PageHeader>
      <EmptyState title="No runs yet." next={<LinkButton to={paths.profile.getHref()}>Check your profile</LinkButton>}>
        <p>
          Dropping GPX and TCX watch files here arrives with the import feature. Each run will then show its splits per mile and
          per kilometre, moving time against clock time, and heart rate and elevation for every split.
        </p>
        <p>Until then, set your heart rates and time zone: splits, zones and dates read from them.</p>
      </EmptyState>
    </>
  );
}
