import type { Unit } from '../../../../shared/users/schemas.ts';
import { useHeldChoice } from '../../../lib/use-held-choice.ts';
import { useProfile } from './get-profile.ts';
import { useUpdateProfile } from './update-profile.ts';

/** The one unit setting (issue 17), for every switch that changes it: the choice shows at once, saves to the profile. */
export function useUnitChoice() {
  const profile = useProfile();
  const mutation = useUpdateProfile();
  const { shown, hold, release } = useHeldChoice<Unit>(profile.unit);

  function choose(next: Unit) {
    hold(next);
    mutation.mutate({ unit: next }, { onError: release });
  }

  return { unit: shown, choose, error: mutation.isError ? mutation.error : null };
}
