import type { ReactNode } from "react";
import { Alert, Button, Field, Input } from "@/components/ui";
import { applyServerErrors, FormError, useZodForm } from "@/lib/forms";
import { forgotSchema, type ForgotInput } from "../schemas";

/** One e-mail field that asks the server to mail a link, then says where it went (password reset, club sign-up). */
export function EmailLinkForm(p: {
  send: (v: ForgotInput) => Promise<unknown>;
  pending: boolean;
  sentTo: string | undefined;
  onReset: () => void;
  label: string;
  submitLabel: string;
  initialEmail?: string;
  /** What happens next, once the link is on its way. */
  sentNote: (email: ReactNode) => ReactNode;
}) {
  const form = useZodForm(forgotSchema, { defaultValues: { email: p.initialEmail ?? "" } });
  const onSubmit = form.handleSubmit((values) => p.send(values).catch((e) => applyServerErrors(form, e)));
  if (p.sentTo)
    return (
      <div className="flex flex-col gap-5">
        <Alert tone="ok">{p.sentNote(<strong className="font-semibold">{p.sentTo}</strong>)}</Alert>
        <Button variant="secondary" onClick={p.onReset}>
          Use a different e-mail
        </Button>
      </div>
    );
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
      <FormError form={form} />
      <Field label={p.label} error={form.formState.errors.email?.message}>
        <Input type="email" autoComplete="email" autoFocus placeholder="name@club.org" {...form.register("email")} />
      </Field>
      <Button type="submit" loading={p.pending} className="w-full">
        {p.submitLabel}
      </Button>
    </form>
  );
}
