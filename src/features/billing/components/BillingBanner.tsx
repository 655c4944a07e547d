import { Link } from "react-router-dom";
import { Alert } from "@/components/ui";
import { formatDate } from "@/lib/format";
import { useActiveTeam } from "@/lib/session";
import { useBilling } from "../api/billing";

/** Under the top bar on every page while the club's payment is overdue: everyone should know why, admins where to pay. */
export function BillingBanner() {
  const team = useActiveTeam();
  const billing = useBilling(team?.id ?? "");
  const s = billing.data;
  if (!team || !s || s.access === "ok") return null;
  const where = s.canManage ? (
    <Link to="/billing" className="font-semibold underline">
      Pay the open invoice
    </Link>
  ) : (
    "A team admin can pay the open invoice."
  );
  return s.access === "grace" ? (
    <Alert tone="warn" title={`${s.club.name}'s last payment failed`} className="mb-6">
      Everything keeps working until {formatDate(s.graceEndsAt)}; after that the club's teams become read-only until it is paid. {where}
    </Alert>
  ) : (
    <Alert tone="danger" title={`${s.club.name} is read-only: payment overdue`} className="mb-6">
      Everything can still be seen and nothing was deleted, but nothing can be added or changed. Paying restores it at once. {where}
    </Alert>
  );
}
