import { useMe } from '../api/get-me';
import type { Role } from '@shared/roles';

export interface ActiveStudio {
  studioId: string;
  studioName: string;
  role: Role;
  canEdit: boolean;
  isOwner: boolean;
}

/** The studio the signed-in person is working in; the shell only renders pages once it is known. */
export function useActiveStudio(): ActiveStudio {
  const { data: me } = useMe();
  const studio = me?.studios.find((s) => s.id === me.activeStudioId);
  if (!studio) throw new Error('useActiveStudio used outside a signed-in studio');
  return {
    studioId: studio.id,
    studioName: studio.name,
    role: studio.role,
    canEdit: studio.role === 'owner' || studio.role === 'photographer',
    isOwner: studio.role === 'owner',
  };
}
