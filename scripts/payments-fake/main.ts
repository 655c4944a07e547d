// Runs the payments fake on loopback for scripts/start and scripts/test:
//   node --import tsx scripts/payments-fake/main.ts
// It reads the same variables the app does (PAYMENTS_API_PORT, PAYMENTS_SECRET_KEY,
// PAYMENTS_WEBHOOK_SECRET, PAYMENTS_PRICE_*), plus PAYMENTS_FAKE_WEBHOOK_URL (where to deliver
// events) and PAYMENTS_FAKE_STATE (a JSON file that keeps its customers across restarts).
import { startPaymentsFake } from "./server";
import { fakePrices } from "./prices";

const need = (name: string) => {
  const v = process.env[name];
  if (!v) {
    console.error(`payments fake: ${name} is not set`);
    process.exit(2);
  }
  return v;
};

const fake = await startPaymentsFake({
  port: Number(process.env.PAYMENTS_API_PORT ?? 1620),
  apiKey: need("PAYMENTS_SECRET_KEY"),
  webhookSecret: need("PAYMENTS_WEBHOOK_SECRET"),
  webhookUrl: process.env.PAYMENTS_FAKE_WEBHOOK_URL,
  stateFile: process.env.PAYMENTS_FAKE_STATE,
  prices: fakePrices(),
});
console.log(`payments fake listening on ${fake.url}`);
const stop = () => void fake.close().then(() => process.exit(0));
process.on("SIGINT", stop);
process.on("SIGTERM", stop);
