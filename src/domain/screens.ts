// Every screen and the capability it needs: one table, used by the route loaders, the staff
// menu and the role-matrix test, so a screen can't ship without its row.
import type { Capability } from './roles';

export const SCREENS = {
  counter: { path: '/counter', label: 'Counter', need: 'takeOrders' },
  bar: { path: '/bar', label: 'Bar', need: 'makeDrinks' },
  pickup: { path: '/pickup', label: 'Pickup', need: 'viewPickup' },
  pulse: { path: '/pulse', label: 'Pulse', need: 'viewPulse' },
  reports: { path: '/reports', label: 'Reports', need: 'viewReports' },
  cardCheck: { path: '/reports/cards', label: 'Card check', need: 'viewReports' },
  outbox: { path: '/outbox', label: 'Outbox', need: 'viewOutbox' },
  receipt: { path: '/receipts/:id', label: 'Receipt', need: 'takeOrders' },
  labels: { path: '/labels/:id', label: 'Cup labels', need: 'takeOrders' },
  adminMenu: { path: '/admin/menu', label: 'Menu', need: 'editMenu' },
  adminTeam: { path: '/admin/team', label: 'Team', need: 'manageTeam' },
  adminBeans: { path: '/admin/beans', label: 'Beans', need: 'manageBeans' },
  adminSettings: { path: '/admin/settings', label: 'Settings', need: 'editSettings' },
  dialIn: { path: '/dial-in', label: 'Dial-in', need: 'logDialIn' },
} as const satisfies Record<string, { path: string; label: string; need: Capability }>;

export type ScreenId = keyof typeof SCREENS;
