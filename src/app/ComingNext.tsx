import { EmptyState, PageHeader } from "@/components/ui";
import { useActiveTeam } from "@/lib/session";

interface ComingNextProps {
  title: string;
  /** What the page will let people do, in a sentence or two. */
  children: React.ReactNode;
}

/** A friendly stand-in for an area whose page has not landed yet. */
export function ComingNext({ title, children }: ComingNextProps) {
  const team = useActiveTeam();
  return (
    <>
      <PageHeader eyebrow={team?.name} title={title} />
      <EmptyState title={`Coming next: ${title}`}>{children}</EmptyState>
    </>
  );
}
