// The flag that lets exactly one caller through better-auth's e-mail sign-up: createAccount
// (accounts.ts). Kept apart from accounts.ts so auth.ts can read it without an import cycle.
import { AsyncLocalStorage } from "node:async_hooks";

const productSignUp = new AsyncLocalStorage<true>();

export const runAsProductSignUp = <T>(fn: () => Promise<T>) => productSignUp.run(true, fn);
export const isProductSignUp = () => productSignUp.getStore() === true;
