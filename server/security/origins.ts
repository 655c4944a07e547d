// The origins allowed to send writes: exactly the list better-auth trusts, so the two checks
// never disagree.
import { auth } from "../auth/auth";
import { env } from "../env";

export function trustedOrigins(): string[] {
  const listed = auth().options.trustedOrigins;
  return Array.isArray(listed) ? listed : [env().PUBLIC_URL];
}
