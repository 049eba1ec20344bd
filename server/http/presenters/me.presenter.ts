import type { MeView } from '../../services/me.service.ts';
import type { Me } from '../../contract/me.ts';

/** What leaves the server about the signed-in person: no provider ids, no internal flags. */
export function presentMe(view: MeView): Me {
  return {
    user: {
      id: view.user.id,
      email: view.user.email,
      name: view.user.displayName,
      timeZone: view.user.timeZone,
      clock: view.user.clock,
    },
    labs: view.labs.map((l) => ({ slug: l.slug, name: l.name, role: l.role })),
  };
}
