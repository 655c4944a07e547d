import { ButtonLink, EmptyState } from "@/components/ui";

export function NotFound() {
  return (
    <EmptyState title="Page not found" action={<ButtonLink to="/" variant="primary">Go to home</ButtonLink>}>
      That address doesn't lead anywhere in Loadframe. Check the link you followed, or start again from home.
    </EmptyState>
  );
}
