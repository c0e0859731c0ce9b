/** Model → API JSON, one pure function a resource. */
export { presentInvitation, presentInvitationPreview } from './invitation';
export { presentOrganisation, presentSession } from './session';
export { presentUser } from './user';
