import { Badge, type BadgeTone } from "@/components/ui";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/Table";
import { formatDate } from "@/lib/format";
import { moneyText } from "@shared/billing/plans";
import type { Invoice } from "@shared/schemas/billing";

const reasons: Record<string, string> = {
  subscription_create: "First month",
  subscription_cycle: "Monthly renewal",
  subscription_update: "Plan change (prorated)",
};
const tones: Record<string, BadgeTone> = { paid: "ok", open: "warn", void: "neutral", uncollectible: "danger", draft: "neutral" };

export function InvoicesTable({ invoices }: { invoices: Invoice[] }) {
  if (!invoices.length) return <p className="text-sm text-ink-muted">No invoices yet. They appear here once the club pays for a plan.</p>;
  return (
    <Table caption="Invoices">
      <THead>
        <Tr>
          <Th>Invoice</Th>
          <Th>Date</Th>
          <Th>For</Th>
          <Th className="text-right">Amount</Th>
          <Th>Status</Th>
          <Th>
            <span className="sr-only">Open</span>
          </Th>
        </Tr>
      </THead>
      <TBody>
        {invoices.map((i) => (
          <Tr key={i.id}>
            <Td primary className="font-medium tabular-nums">{i.number ?? "—"}</Td>
            <Td label="Date">{formatDate(i.createdAt)}</Td>
            <Td label="For">{reasons[i.reason ?? ""] ?? "Invoice"}</Td>
            <Td label="Amount" className="text-right tabular-nums">{moneyText(i.status === "paid" ? i.amountPaidCents : i.amountDueCents, i.currency)}</Td>
            <Td label="Status">
              <Badge tone={tones[i.status] ?? "neutral"}>{i.status === "open" ? "Unpaid" : i.status[0]!.toUpperCase() + i.status.slice(1)}</Badge>
            </Td>
            <Td>
              {i.url && (
                <a className="font-medium text-accent underline-offset-2 hover:underline" href={i.url}>
                  {i.status === "open" ? "Pay now" : "View"}
                </a>
              )}
            </Td>
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}
