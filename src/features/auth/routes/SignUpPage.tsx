import { Alert, Button, Field, Input } from "@/components/ui";
import { applyServerErrors, FormError, useZodForm } from "@/lib/forms";
import { useRequestSignup } from "../api/signup";
import { AuthShell } from "../components/AuthShell";
import { TextLink } from "../components/TextLink";
import { forgotSchema } from "../schemas";

/** A new club starts here: the e-mail is confirmed by a link before anything else. */
export function Component() {
  const request = useRequestSignup();
  const form = useZodForm(forgotSchema, { defaultValues: { email: "" } });
  const sentTo = request.isSuccess ? request.data.email : undefined;
  const onSubmit = form.handleSubmit((values) => request.mutateAsync(values).catch((e) => applyServerErrors(form, e)));

  return (
    <AuthShell
      title={sentTo ? "Check your inbox" : "Start your club on Loadframe"}
      description={sentTo ? undefined : "Your club starts on the free Pond plan: one team, three staff seats, 5 GB of clips. First, confirm your e-mail."}
      footer={<>Already have an account? <TextLink to="/sign-in">Sign in</TextLink></>}
    >
      {sentTo ? (
        <div className="flex flex-col gap-5">
          <Alert tone="ok">
            A link is on its way to <strong className="font-semibold">{sentTo}</strong>. Open it to name your club and choose a password. It works once and
            expires after 24 hours; look in the spam folder if nothing arrives within a few minutes.
          </Alert>
          <Button variant="secondary" onClick={() => request.reset()}>
            Use a different e-mail
          </Button>
        </div>
      ) : (
        <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
          <FormError form={form} />
          <Field label="Your e-mail" error={form.formState.errors.email?.message}>
            <Input type="email" autoComplete="email" autoFocus placeholder="name@club.org" {...form.register("email")} />
          </Field>
          <Button type="submit" loading={request.isPending} className="w-full">
            Send the confirmation link
          </Button>
        </form>
      )}
    </AuthShell>
  );
}
