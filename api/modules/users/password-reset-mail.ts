import type { MailMessage } from '../../mail/mailer';

/** How long a reset link works: one day (common practice for an admin-sent link). */
export const RESET_LINK_HOURS = 24;

export function passwordResetMail(
  to: string,
  person: { name: string },
  sentBy: string,
  link: string,
): MailMessage {
  return {
    to: [to],
    kind: 'user.password_reset_sent',
    relatedSheetId: null,
    subject: 'Set a new Modewright password',
    text:
      `${person.name},\n\n${sentBy} sent you a link to set a new password for Modewright:\n\n` +
      `${link}\n\nThe link works once and for ${RESET_LINK_HOURS} hours. Setting a new password ` +
      'signs you out everywhere. If you did not expect this, tell your administrator.\n\n— Modewright',
  };
}
