/** Outgoing mail: one sendMail() for the whole server, plus the templates. */
export { sendMail, sentMail, type MailMessage, type SentMail } from './transport';
export { invitationMail } from './templates';
