// Staff roles and what each may do. A lead can do everything a cashier and a barista can;
// an owner can do everything.
export const ROLES = ['cashier', 'barista', 'lead', 'owner'] as const;
export type Role = (typeof ROLES)[number];

/** Which roles each capability needs. Kept as one table so routes and screens agree. */
export const CAPABILITIES = {
  takeOrders: ['cashier', 'lead', 'owner'],
  makeDrinks: ['barista', 'lead', 'owner'],
  viewQueue: ['cashier', 'barista', 'lead', 'owner'],
  viewPickup: ['cashier', 'barista', 'lead', 'owner'],
  viewOutbox: ['lead', 'owner'],
  giveDiscounts: ['lead', 'owner'],
  refundOrders: ['lead', 'owner'],
  // a drink made again at no charge: asked for where the customer is, at the Counter or the
  // pickup shelf; a barista tells the Counter (the Bar shows the remake when it comes back)
  remakeDrinks: ['cashier', 'lead', 'owner'],
  eightySix: ['lead', 'owner'],
  rushTickets: ['lead', 'owner'],
  collectTickets: ['cashier', 'barista', 'lead', 'owner'],
  viewPulse: ['lead', 'owner'],
  viewReports: ['lead', 'owner'],
  runShifts: ['lead', 'owner'],
  // back office
  editMenu: ['owner'],
  manageTeam: ['owner'],
  editSettings: ['owner'],
  manageBeans: ['owner'],
  // a group of cafés: which café the session works on, and the group's report
  switchCafe: ['owner'],
  logDialIn: ['barista', 'lead', 'owner'],
} as const satisfies Record<string, readonly Role[]>;

export type Capability = keyof typeof CAPABILITIES;

export function can(role: Role | undefined | null, capability: Capability): boolean {
  if (!role) return false;
  return (CAPABILITIES[capability] as readonly Role[]).includes(role);
}

/** Where each role lands after signing in. */
export const HOME_SCREEN: Record<Role, string> = {
  cashier: '/counter',
  barista: '/bar',
  lead: '/pulse',
  owner: '/counter',
};
