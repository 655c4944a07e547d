// The methods that only read (RFC 9110 §9.2.1 "Safe Methods" [P]; TRACE is not served here): a
// request with one of these changes nothing, so the write checks (cross-site, unpaid club, a
// session asked of the database) leave it alone.
export const SAFE_METHODS: ReadonlySet<string> = new Set(["GET", "HEAD", "OPTIONS"]);
