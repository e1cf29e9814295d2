import { useParams } from 'react-router-dom';
import { UnsubscribePanel } from '../../../features/notices/components/unsubscribe-panel.tsx';

/** `/notices/off/:token`, the unsubscribe link at the bottom of every notice; open whether or not someone is signed in. */
export default function NoticesOffRoute() {
  const token = useParams().token ?? '';
  return (
    <>
      <title>Turn off e-mails · Pacewright</title>
      <UnsubscribePanel token={token} />
    </>
  );
}
