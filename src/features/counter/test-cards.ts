// The Counter's simulated card reader offers the payment provider's documented test cards
// (see check-values.md); each maps to the provider's test payment method id.
export const TEST_CARDS = [
  { label: 'Visa •••• 4242', outcome: 'approves', paymentMethod: 'pm_card_visa' },
  { label: 'Card •••• 0002', outcome: 'declines', paymentMethod: 'pm_card_chargeDeclined' },
  { label: 'Card •••• 9995', outcome: 'insufficient funds', paymentMethod: 'pm_card_chargeDeclinedInsufficientFunds' },
  { label: 'Card •••• 0069', outcome: 'expired card', paymentMethod: 'pm_card_chargeDeclinedExpiredCard' },
] as const;
