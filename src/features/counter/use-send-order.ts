import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateOrderBody } from '@/domain/schemas';
import { send } from '@/lib/commands';
import { menuKeys } from '@/queries/menu';

/**
 * Send an order. A retry after a dropped connection sends the same clientOrderId, so the
 * server answers with the order it already has rather than taking it twice.
 */
export function useSendOrder() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateOrderBody) => send.placeOrder(body),
    onError: (err: { status?: number }) => {
      // 409 unavailable: something was 86'd since the menu loaded
      if (err.status === 409) qc.invalidateQueries({ queryKey: menuKeys.all });
    },
  });
}
