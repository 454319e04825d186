// The README's pictures: each screen at the width it is used at, signed in as the person who uses
// it, taken once its content is there (never after a fixed sleep).
import { expect as baseExpect, type Page } from '@playwright/test';
import type { Login } from '../../e2e/fixtures';

export interface Scene {
  /** An order with an allergy, an e-mailed receipt and a pastry. */
  showcaseOrderId: number;
  /** The invitation link a new barista was mailed (for the Welcome screen). */
  welcomePath: string | null;
}

export interface Screen {
  /** docs/screenshots/<name>.png */
  name: string;
  path: (scene: Scene) => string | null;
  /** null: signed out */
  as: Login | null;
  viewport: { width: number; height: number };
  fullPage?: boolean;
  /** Waits for the content that makes the picture, and does what the picture shows. */
  ready: (page: Page) => Promise<void>;
}

/** Content waits: generous, since the machine may be busy; a screen that never fills fails by name. */
const expect = baseExpect.configure({ timeout: 20_000 });

const TABLET = { width: 1024, height: 768 };
const PHONE = { width: 390, height: 844 };
const WALL = { width: 1920, height: 1080 };
const LAPTOP = { width: 1366, height: 768 };

const live = (page: Page) => expect(page.getByRole('status').filter({ hasText: 'Live' }).first()).toBeVisible();
const heading = (page: Page, name: string) => expect(page.getByRole('heading', { name, level: 1 })).toBeVisible();
const drinks = async (page: Page) => {
  await live(page);
  await expect(page.getByTestId('drink-card')).not.toHaveCount(0); // the first may sit below a lane's fold
};

/** A half-built order: a regular oat latte and a croissant for Maya, not yet sent. */
async function buildOrder(page: Page) {
  await live(page);
  await page.getByRole('button', { name: /^Latte/ }).click();
  await page.getByRole('radio', { name: /Oat/ }).click();
  await page.getByRole('button', { name: /Add to order/ }).click();
  await page.getByRole('tab', { name: 'Food' }).click();
  await page.getByRole('button', { name: /^Butter croissant/ }).click();
  await expect(page.getByTestId('order-line')).toHaveCount(2);
  await page.getByLabel('Name for the cup').fill('Maya Lindqvist');
  await page
    .getByRole('tab', { name: /Coffee|Espresso|Drinks/ })
    .first()
    .click();
}

/** The Bar and Pickup first: their ages are read as close as can be to the moment the rush stops. */
export const SCREENS: Screen[] = [
  { name: 'bar', path: () => '/bar', as: 'barista', viewport: WALL, ready: drinks },
  { name: 'bar-tablet', path: () => '/bar', as: 'barista2', viewport: TABLET, ready: drinks },
  {
    name: 'pickup',
    path: () => '/pickup',
    as: 'cashier',
    viewport: WALL,
    ready: async (p) => {
      await expect(p.getByRole('region', { name: 'Ready' })).toBeVisible();
      await expect(p.getByRole('region', { name: 'Being made' })).toBeVisible();
    },
  },
  { name: 'signin', path: () => '/signin', as: null, viewport: TABLET, ready: (p) => expect(p.getByRole('button', { name: 'Sign in' })).toBeEnabled() },
  { name: 'counter', path: () => '/counter', as: 'cashier', viewport: TABLET, ready: buildOrder },
  {
    name: 'counter-item-sheet',
    path: () => '/counter',
    as: 'cashier',
    viewport: TABLET,
    ready: async (p) => {
      await live(p);
      await p.getByRole('button', { name: /^Cappuccino/ }).click();
      await p.getByRole('radio', { name: /Almond/ }).click();
      await expect(p.getByRole('dialog')).toBeVisible();
    },
  },
  {
    name: 'counter-phone',
    path: () => '/counter',
    as: 'cashier',
    viewport: PHONE,
    ready: async (p) => {
      await live(p);
      await expect(p.getByRole('button', { name: /^Latte/ })).toBeVisible();
    },
  },
  { name: 'pulse', path: () => '/pulse', as: 'lead', viewport: LAPTOP, ready: pulseReady },
  { name: 'pulse-phone', path: () => '/pulse', as: 'lead', viewport: PHONE, ready: pulseReady },
  {
    name: 'reports',
    path: () => '/reports',
    as: 'owner',
    viewport: LAPTOP,
    ready: async (p) => {
      await heading(p, 'Reports');
      await expect(p.getByText('Median wait', { exact: false }).first()).toBeVisible();
    },
  },
  { name: 'card-check', path: () => '/reports/cards', as: 'lead', viewport: LAPTOP, ready: (p) => heading(p, 'Card check') },
  {
    name: 'menu-admin',
    path: () => '/admin/menu',
    as: 'owner',
    viewport: LAPTOP,
    ready: (p) => expect(p.getByTestId('menu-item-row').first()).toBeVisible(),
  },
  { name: 'team', path: () => '/admin/team', as: 'owner', viewport: LAPTOP, ready: (p) => expect(p.getByTestId('team-row').first()).toBeVisible() },
  {
    name: 'dial-in',
    path: () => '/dial-in',
    as: 'barista',
    viewport: LAPTOP,
    ready: (p) => expect(p.getByRole('heading', { level: 1 })).toBeVisible(),
  },
  {
    name: 'receipt',
    path: (s) => `/receipts/${s.showcaseOrderId}`,
    as: 'cashier',
    viewport: { width: 480, height: 900 },
    fullPage: true,
    ready: (p) => expect(p.getByRole('heading', { name: 'Harbour & Hearth Coffee' })).toBeVisible(),
  },
  {
    name: 'cup-labels',
    path: (s) => `/labels/${s.showcaseOrderId}`,
    as: 'cashier',
    viewport: { width: 480, height: 300 },
    fullPage: true,
    ready: (p) => expect(p.getByTestId('cup-label').first()).toContainText('ALLERGY'),
  },
  {
    name: 'outbox',
    path: () => '/outbox',
    as: 'lead',
    viewport: LAPTOP,
    ready: async (p) => {
      await heading(p, 'Outbox');
      await expect(p.getByTestId('outbox-mail').first()).toBeVisible();
    },
  },
  {
    name: 'welcome',
    path: (s) => s.welcomePath,
    as: null,
    viewport: TABLET,
    ready: (p) => expect(p.getByRole('button').first()).toBeEnabled(),
  },
];

async function pulseReady(page: Page) {
  await live(page);
  await expect(page.getByRole('region', { name: 'Shift', exact: true })).toContainText('Shift open since');
  await expect(page.getByTestId('staffing')).not.toBeEmpty();
}
