import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths.ts';
import { useOutbox } from '../api/get-outbox.ts';

/**
 * A link to the development outbox, shown only where the outbox answers: the built app cannot tell
 * development from production by itself, but the API answers 404 in production.
 */
export function OutboxLink() {
  const outbox = useOutbox();
  if (!outbox.isSuccess) return null;
  return (
    <p className="text-sm text-ink-muted">
      Development:{' '}
      <Link to={paths.devOutbox.getHref()} className="font-semibold text-teal underline">
        outbox
      </Link>{' '}
      ({outbox.data.length} caught {outbox.data.length === 1 ? 'message' : 'messages'})
    </p>
  );
}
