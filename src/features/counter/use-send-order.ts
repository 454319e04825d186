import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateOrderBody } from '@/domain/schemas';
import type { OrderView } from '@/domain/types';
import { http } from '@/lib/http';
import { menuKeys } from '@/queries/menu';

/**
 * Send an order. A retry after a dropped connection sends the same clientOrderId, so the
 * server answers with the order it already has rather than taking it twice.
 */
export function useSendOrder() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateOrderBody) => http<{ order: OrderView }>('POST', '/orders', body),
    onError: (err: { status?: number }) => {
      // 409 unavailable: something was 86'd since the menu loaded
      if (err.status === 409) qc.invalidateQueries({ queryKey: menuKeys.all });
    },
  });
}
