import { Card } from "@/components/ui";
import { ROLES, roleLabel, roleMeaning } from "@/lib/roles";

export function RolesGuide() {
  return (
    <Card title="What each role can do">
      <dl className="flex flex-col gap-3 text-sm">
        {ROLES.map((r) => (
          <div key={r}>
            <dt className="font-semibold text-ink">{roleLabel[r]}</dt>
            <dd className="text-ink-muted">{roleMeaning[r]}</dd>
          </div>
        ))}
      </dl>
    </Card>
  );
}
