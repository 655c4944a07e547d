// Test card numbers the fake's hosted pages accept, and what each does. The numbers are the ones
// the payment service publishes for its test mode (from memory of its public testing page); the
// fake gives each the same behaviour on the first payment. A real card number is refused, as the
// service's test mode does.
export type CardOutcome = "succeeds" | "declined" | "authenticate";

export const TEST_CARDS: { number: string; outcome: CardOutcome; label: string }[] = [
  { number: "4242424242424242", outcome: "succeeds", label: "Pays" },
  { number: "4000000000000002", outcome: "declined", label: "Declined" },
  { number: "4000002500003155", outcome: "authenticate", label: "Asks the cardholder to authenticate, then pays" },
  { number: "4000000000000341", outcome: "succeeds", label: "Pays now; every later charge is declined (a failed renewal)" },
];

/** A card that pays when charged without the cardholder present (renewals, prorations). */
export const chargesLater = (card: string | null | undefined) => !!card && card !== "4000000000000341" && card !== "4000000000000002";

export const digitsOf = (s: string) => s.replace(/[\s-]/g, "");

export function outcomeOf(card: string): CardOutcome | "not_test_card" | "invalid" {
  if (!/^\d{12,19}$/.test(card)) return "invalid";
  return TEST_CARDS.find((c) => c.number === card)?.outcome ?? "not_test_card";
}
