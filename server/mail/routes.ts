// Mailing a receipt: the handler of its command (src/commands.ts). The Outbox, the mail the local
// SMTP fake caught, is a read (src/reads.ts).
import type { AllCommandHandlers } from '@server/commands';
import { DomainError } from '@server/domain-errors';
import { HttpError } from '@server/errors';
import type { Mailer } from './outbox';
import { sendOrderReceipt } from '@server/orders/receipts';

/** Without a mailer the receipt has no route. */
export function mailCommands(mailer: Mailer | undefined): Pick<AllCommandHandlers, 'mailReceipt'> {
  if (!mailer) return { mailReceipt: null };
  return {
    mailReceipt: async ({ deps, user, params: { id } }, { email }) => {
      let sent: { messageId: string };
      try {
        sent = await sendOrderReceipt(deps.db, mailer, user.locationId, id, email);
      } catch (err) {
        if (err instanceof HttpError || err instanceof DomainError) throw err;
        // The mail server refused or was unreachable: the cashier can try again, nothing is lost.
        console.warn(`Receipt for order ${id} was not sent: ${(err as Error).message}`);
        throw new HttpError(502, 'internal', 'The mail server did not take the receipt; try again');
      }
      // 202 (the command's status): handed to the mail server, which delivers it in its own time
      return { sent: true, messageId: sent.messageId };
    },
  };
}
