import type { OrganisationDTO, SessionDTO } from '../../shared/api/session';
import type { Organisation } from '../models/Organisation';
import type { User } from '../models/User';
import { presentUser } from './user';

/** An organisation as the session shows it. */
export function presentOrganisation(organisation: Organisation): OrganisationDTO {
  return { id: organisation.id, name: organisation.name };
}

/** The session answer: who is signed in (or nobody), their organisation, and the CSRF token. */
export function presentSession(
  user: User | null,
  organisation: Organisation | null,
  csrfToken: string,
): SessionDTO {
  return {
    user: user ? presentUser(user) : null,
    organisation: organisation ? presentOrganisation(organisation) : null,
    csrfToken,
  };
}
