import { useSearchParams } from "react-router-dom";
import { Alert, Button, ButtonLink, Field, Input } from "@/components/ui";
import { isApiError } from "@/lib/api";
import { applyServerErrors, FormError, useZodForm } from "@/lib/forms";
import { useResetPassword } from "../api/resetPassword";
import { AuthShell } from "../components/AuthShell";
import { TextLink } from "../components/TextLink";
import { PASSWORD_MIN, resetSchema } from "../schemas";

export function Component() {
  const [params] = useSearchParams();
  const token = params.get("token");
  // better-auth sends people here with ?error=INVALID_TOKEN when the mailed link is stale.
  const linkError = params.get("error");
  const reset = useResetPassword();
  const form = useZodForm(resetSchema, { defaultValues: { newPassword: "", confirm: "" } });
  const { errors } = form.formState;

  if (!token || linkError) {
    return (
      <AuthShell title="This reset link doesn't work" footer={<TextLink to="/sign-in">Back to sign in</TextLink>}>
        <div className="flex flex-col gap-5">
          <p className="text-ink-muted">The link is incomplete, has expired or was already used. Ask for a fresh one — it takes a moment.</p>
          <ButtonLink to="/forgot-password" variant="primary" className="w-full">
            Send a new link
          </ButtonLink>
        </div>
      </AuthShell>
    );
  }

  if (reset.isSuccess) {
    return (
      <AuthShell title="Password changed">
        <div className="flex flex-col gap-5">
          <Alert tone="ok">Your new password is set. Sign in with it from now on.</Alert>
          <ButtonLink to="/sign-in" variant="primary" className="w-full">
            Sign in
          </ButtonLink>
        </div>
      </AuthShell>
    );
  }

  const onSubmit = form.handleSubmit(({ newPassword }) => 
    reset.mutateAsync({ newPassword, token }).catch((e) => {
      if (isApiError(e) && e.code === "invalid_token") {
        form.setError("root.server", { type: e.code, message: "This reset link has expired or was already used. Ask for a new one below." });
      } else applyServerErrors(form, e);
    }),
  );

  return (
    <AuthShell title="Choose a new password" description="Pick one you don't use anywhere else." footer={
        <span className="flex justify-center gap-4">
          <TextLink to="/forgot-password">Send a new link</TextLink>
          <TextLink to="/sign-in">Back to sign in</TextLink>
        </span>
      }
    >
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
        <FormError form={form} />
        <input type="text" name="username" autoComplete="username" value={params.get("email") ?? ""} readOnly hidden />
        <Field label="New password" hint={`At least ${PASSWORD_MIN} characters.`} error={errors.newPassword?.message}>
          <Input type="password" autoComplete="new-password" autoFocus {...form.register("newPassword")} />
        </Field>
        <Field label="New password again" error={errors.confirm?.message}>
          <Input type="password" autoComplete="new-password" {...form.register("confirm")} />
        </Field>
        <Button type="submit" loading={reset.isPending} className="w-full">
          Set new password
        </Button>
      </form>
    </AuthShell>
  );
}
