// The card check's query and the lead's "settle" body: a café-local date (today when left out).
import { z } from 'zod';
import { calendarDate } from './schemas';

/** GET /api/reports/cards */
export const cardCheckQuery = z.object({ date: calendarDate.optional() });

/** POST /api/reports/cards/settle */
export const cardSettleBody = z.object({ date: calendarDate });
