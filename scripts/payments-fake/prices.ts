import { DEFAULT_PRICE_IDS, PLANS } from "../../shared/billing/plans";

/** The fake offers one monthly price per paid plan, under the ids the app is configured with. */
export function fakePrices(source: NodeJS.ProcessEnv = process.env) {
  return {
    [source.PAYMENTS_PRICE_RINK || DEFAULT_PRICE_IDS.rink]: { unitAmount: PLANS.rink.monthlyCents },
    [source.PAYMENTS_PRICE_ARENA || DEFAULT_PRICE_IDS.arena]: { unitAmount: PLANS.arena.monthlyCents },
  };
}
