// Request bodies, query strings and socket messages, written once and used by both the forms
// and the server routes.
import { z } from 'zod';

export const signInBody = z.object({
  username: z.string().trim().min(1, 'Enter your sign-in name').max(64),
  password: z.string().min(1, 'Enter your password').max(72, 'Passwords are at most 72 characters'),
});
export type SignInBody = z.infer<typeof signInBody>;

export const idParam = z.object({ id: z.coerce.number().int().positive() });

export const orderLineInput = z.object({
  menuItemId: z.number().int().positive(),
  sizeId: z.number().int().positive().optional(),
  milkId: z.number().int().positive().optional(),
  shots: z.number().int().min(0).max(8).optional(),
  modifierIds: z.array(z.number().int().positive()).max(12).optional(),
  note: z.string().trim().max(140).optional(),
});
export type OrderLineInput = z.infer<typeof orderLineInput>;

export const cashPayment = z.object({
  method: z.literal('cash'),
  tenderedCents: z.number().int().min(0).max(10_000_00),
});

export const createOrderBody = z.object({
  clientOrderId: z.uuid(),
  customerName: z.string().trim().min(1, 'Enter the customer name').max(40),
  items: z.array(orderLineInput).min(1, 'Add at least one item').max(40),
  payment: z.discriminatedUnion('method', [cashPayment]),
});
export type CreateOrderBody = z.infer<typeof createOrderBody>;

export const ticketsQuery = z.object({
  status: z.enum(['open', 'board']).default('open'),
});

/** Messages a screen may send over the live socket. */
export const clientMessage = z.discriminatedUnion('type', [
  z.object({ type: z.literal('resume'), since: z.number().int().min(0) }),
  z.object({ type: z.literal('ping') }),
]);
export type ClientMessage = z.infer<typeof clientMessage>;

/** The Counter's form: the order without its id and payment, which are added on send. */
export const orderDraft = createOrderBody.pick({ customerName: true, items: true });
export type OrderDraft = z.infer<typeof orderDraft>;
