/** Reads of organisations, users and invitations for routes (see README.md). */
import { Op } from 'sequelize';
import { Invitation } from '../models/Invitation';
import { Organisation } from '../models/Organisation';
import { User } from '../models/User';

/** An organisation by id, or null. */
export function findOrganisation(id: string): Promise<Organisation | null> {
  return Organisation.findByPk(id);
}

/** A user of the organisation, or null (other organisations' users do not exist for it). */
export function findUser(organisationId: string, id: string): Promise<User | null> {
  return User.findOne({ where: { id, organisationId } });
}

/** The organisation's users by name, then e-mail. */
export function listUsers(organisationId: string): Promise<User[]> {
  return User.findAll({ where: { organisationId }, order: [['name', 'ASC'], ['email', 'ASC']] });
}

/** An invitation of the organisation, or null. */
export function findInvitation(organisationId: string, id: string): Promise<Invitation | null> {
  return Invitation.findOne({ where: { id, organisationId } });
}

/** The organisation's invitations whose link still works, newest first, with who sent each. */
export function listPendingInvitations(organisationId: string, now = new Date()): Promise<Invitation[]> {
  return Invitation.findAll({
    where: { organisationId, acceptedAt: null, expiresAt: { [Op.gt]: now } },
    include: [{ association: 'invitedBy' }],
    order: [['createdAt', 'DESC']],
  });
}
