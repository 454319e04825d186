import type { CommandHandlers } from '@server/commands';
import { HttpError, notFound } from '@server/errors';
import { GatewayUnavailable } from '@server/payments/gateway';
import { handlePaymentWebhook } from '@server/payments/card-settle';
import type { Deps } from '@server/deps';
import { createOrder } from './orders';
import { mailReceiptWithOrder } from './receipts';
import { refundOrder, voidOrder } from './refunds';
import { refundDrink } from './drink-refunds';
import { remakeDrink } from './remakes';
import type { ApiRoute } from '@server/routes';

export const WEBHOOK_PATH = '/webhooks/payments';

/** The orders' commands (src/commands.ts). */
export const orderCommands: CommandHandlers<'placeOrder' | 'refundOrder' | 'voidOrder' | 'refundDrink' | 'remakeDrink'> = {
  placeOrder: async ({ deps, user, status }, body) => {
    const { order, created } = await createOrder(deps, user, body);
    // after the commit, however the order came (at once, queued offline, a retry): once per order
    await mailReceiptWithOrder(deps, user.locationId, order);
    // the same clientOrderId again: the order the server already has, not a new one
    if (!created) status(200);
    return { order };
  },
  refundOrder: async ({ deps, user, params }, body) => ({ order: await refundOrder(deps, user, params.id, body) }),
  voidOrder: async ({ deps, user, params }, { reason }) => ({ order: await voidOrder(deps, user, params.id, reason) }),
  refundDrink: async ({ deps, user, params }, { reason }) => ({ order: await refundDrink(deps, user, params.id, reason) }),
  remakeDrink: async ({ deps, user, params }, body) => ({ order: await remakeDrink(deps, user, params.id, body) }),
};

/** The payment provider's webhook: a plain route, not a command (its raw body is checked against its signature). */
export function orderRoutes(deps: Deps): ApiRoute[] {
  return [
    {
      // The payment provider calls this; its signature, not a session, says who it is.
      method: 'post',
      path: WEBHOOK_PATH,
      capability: null,
      handler: async (req, res) => {
        if (!deps.payments) throw notFound('Route');
        const signature = req.get('stripe-signature');
        if (!signature || !Buffer.isBuffer(req.body)) throw new HttpError(400, 'validation_failed', 'Missing signature or body');
        let event;
        try {
          event = deps.payments.parseWebhook(req.body, signature);
        } catch {
          throw new HttpError(400, 'validation_failed', 'The webhook signature does not match');
        }
        try {
          await handlePaymentWebhook(deps, event);
        } catch (err) {
          if (!(err instanceof GatewayUnavailable)) throw err;
          // Jugline couldn't ask the card service about it: the card service sends it again later.
          res.set('Retry-After', '60');
          throw new HttpError(503, 'unavailable', 'The card service did not answer; send this event again later');
        }
        res.json({ received: true });
      },
    },
  ];
}
