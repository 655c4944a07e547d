import { useSearchParams } from "react-router-dom";
import { Alert, Button, Field, Input } from "@/components/ui";
import { applyServerErrors, FormError, useZodForm } from "@/lib/forms";
import { useRequestPasswordReset } from "../api/requestPasswordReset";
import { AuthShell } from "../components/AuthShell";
import { TextLink } from "../components/TextLink";
import { forgotSchema } from "../schemas";

export function Component() {
  const [params] = useSearchParams();
  const request = useRequestPasswordReset();
  const form = useZodForm(forgotSchema, { defaultValues: { email: params.get("email") ?? "" } });
  const sentTo = request.isSuccess ? request.variables?.email : undefined;

  const onSubmit = form.handleSubmit((values) => request.mutateAsync(values).catch((e) => applyServerErrors(form, e)));

  return (
    <AuthShell
      title={sentTo ? "Check your inbox" : "Forgot your password?"}
      description={sentTo ? undefined : "Enter the e-mail you sign in with and we'll send a link to choose a new password."}
      footer={<TextLink to="/sign-in">Back to sign in</TextLink>}
    >
      {sentTo ? (
        <div className="flex flex-col gap-5">
          <Alert tone="ok">
            If an account exists, a link is on its way to <strong className="font-semibold">{sentTo}</strong>. It works once and expires after an
            hour; look in the spam folder if nothing arrives within a few minutes.
          </Alert>
          <Button variant="secondary" onClick={() => request.reset()}>
            Use a different e-mail
          </Button>
        </div>
      ) : (
        <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
          <FormError form={form} />
          <Field label="E-mail" error={form.formState.errors.email?.message}>
            <Input type="email" autoComplete="email" autoFocus placeholder="name@club.org" {...form.register("email")} />
          </Field>
          <Button type="submit" loading={request.isPending} className="w-full">
            Send reset link
          </Button>
        </form>
      )}
    </AuthShell>
  );
}
