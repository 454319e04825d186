import { createOrderBody, idParam, refundBody, voidBody } from '@/domain/schemas';
import { userOf } from '@server/auth/guards';
import { HttpError, notFound, parse } from '@server/errors';
import { GatewayUnavailable } from '@server/payments/gateway';
import { handlePaymentWebhook } from '@server/payments/card-settle';
import type { Deps } from '@server/deps';
import { createOrder } from './orders';
import { mailReceiptWithOrder } from './receipts';
import { refundOrder, voidOrder } from './refunds';
import type { ApiRoute } from '@server/routes';

export const WEBHOOK_PATH = '/webhooks/payments';

export function orderRoutes(deps: Deps): ApiRoute[] {
  const id = (params: unknown) => parse(idParam, params, 'params').id;
  return [
    {
      method: 'post',
      path: '/orders',
      capability: 'takeOrders',
      handler: async (req, res) => {
        const body = parse(createOrderBody, req.body);
        const user = userOf(req);
        const { order, created } = await createOrder(deps, user, body);
        // after the commit, however the order came (at once, queued offline, a retry): once per order
        await mailReceiptWithOrder(deps, user.locationId, order);
        res.status(created ? 201 : 200).json({ order });
      },
    },
    {
      method: 'post',
      path: '/orders/:id/refund',
      capability: 'refundOrders',
      handler: async (req, res) => {
        const orderId = id(req.params);
        res.json({ order: await refundOrder(deps, userOf(req), orderId, parse(refundBody, req.body)) });
      },
    },
    {
      method: 'post',
      path: '/orders/:id/void',
      capability: 'refundOrders',
      handler: async (req, res) => {
        const orderId = id(req.params);
        res.json({ order: await voidOrder(deps, userOf(req), orderId, parse(voidBody, req.body).reason) });
      },
    },
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
