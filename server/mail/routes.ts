// Mailing a receipt (the Outbox, the mail the local SMTP fake caught, is a read: src/reads.ts).
import { idParam, receiptEmailBody } from '@/domain/schemas';
import { userOf } from '@server/auth/guards';
import { DomainError } from '@server/domain-errors';
import { HttpError, parse } from '@server/errors';
import type { Deps } from '@server/deps';
import type { Mailer } from './outbox';
import { sendOrderReceipt } from '@server/orders/receipts';
import type { ApiRoute } from '@server/routes';

export function mailRoutes(deps: Deps, mailer: Mailer): ApiRoute[] {
  return [
    {
      method: 'post',
      path: '/orders/:id/receipt',
      capability: 'takeOrders',
      handler: async (req, res) => {
        const { id } = parse(idParam, req.params, 'params');
        const { email } = parse(receiptEmailBody, req.body);
        const user = userOf(req);
        let sent: { messageId: string };
        try {
          sent = await sendOrderReceipt(deps.db, mailer, user.locationId, id, email);
        } catch (err) {
          if (err instanceof HttpError || err instanceof DomainError) throw err;
          // The mail server refused or was unreachable: the cashier can try again, nothing is lost.
          console.warn(`Receipt for order ${id} was not sent: ${(err as Error).message}`);
          throw new HttpError(502, 'internal', 'The mail server did not take the receipt; try again');
        }
        // 202: handed to the mail server, which delivers it in its own time
        res.status(202).json({ sent: true, messageId: sent.messageId });
      },
    },
  ];
}
