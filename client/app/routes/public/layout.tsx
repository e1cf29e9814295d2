import { Outlet } from 'react-router-dom';
import { CardPage } from '../../../components/layout/card-page.tsx';

/**
 * Pages a link in an e-mail opens (invitation, password reset): the same look as sign-in, but open
 * whether or not someone is signed in, since the link must work either way.
 */
export default function PublicLayout() {
  return (
    <CardPage>
      <Outlet />
    </CardPage>
  );
}
