import { z } from 'zod';
import { isElementSymbol } from './elements';

/** Analyses may round up a little; a nominal sum above this is a typing error. */
export const MAX_COMPOSITION_SUM = 100.5;

/**
 * Nominal composition in wt.%: listed elements with their contents, and optionally
 * the element that makes up the balance ("Fe bal."), as metallurgists write it.
 */
export interface Composition {
  wtPct: Record<string, number>;
  balance: string | null;
}

export function compositionSum(c: Composition): number {
  return Object.values(c.wtPct).reduce((a, b) => a + b, 0);
}

/** "Fe bal., Mn 22, C 0.6" style, listed elements by falling content. */
export function formatComposition(c: Composition): string {
  const listed = Object.entries(c.wtPct)
    .sort((a, b) => b[1] - a[1])
    .map(([el, v]) => `${el} ${v}`);
  return [...(c.balance ? [`${c.balance} bal.`] : []), ...listed].join(', ');
}

export const compositionSchema = z
  .strictObject({
    wtPct: z.record(
      z.string().refine((s: string): boolean => isElementSymbol(s), { error: (i) => `${String(i.input)} is not a chemical element symbol (mind the case: Mn, not MN).` }),
      z.number({ error: 'Enter a number in wt.%.' }).min(0, { error: 'A content cannot be negative.' }).max(100, { error: 'A content cannot exceed 100 wt.%.' }),
    ),
    balance: z
      .string()
      .refine((s: string): boolean => isElementSymbol(s), { error: 'The balance must be a chemical element symbol, e.g. Fe.' })
      .nullable()
      .default(null),
  })
  .superRefine((c, ctx) => {
    const sum = compositionSum({ wtPct: c.wtPct, balance: null });
    if (sum > MAX_COMPOSITION_SUM) {
      ctx.addIssue({ code: 'custom', path: ['wtPct'], message: `The listed contents add up to ${sum.toFixed(2)} wt.%, more than ${MAX_COMPOSITION_SUM}.` });
    }
    if (c.balance && c.balance in c.wtPct) {
      ctx.addIssue({ code: 'custom', path: ['balance'], message: `${c.balance} is listed with a content and as the balance; keep one.` });
    }
  });
