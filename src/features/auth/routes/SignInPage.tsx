import { useNavigate, useSearchParams } from "react-router-dom";
import { Button, Field, Input } from "@/components/ui";
import { safeNext } from "@/app/guards";
import { applyServerErrors, FormError, useZodForm } from "@/lib/forms";
import { useSignIn } from "../api/signIn";
import { AuthShell } from "../components/AuthShell";
import { TextLink } from "../components/TextLink";
import { signInSchema } from "../schemas";

export function Component() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const next = safeNext(params.get("next"));
  const signIn = useSignIn();
  const form = useZodForm(signInSchema, { defaultValues: { email: params.get("email") ?? "", password: "" } });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit((values) =>
    signIn.mutateAsync(values).then(
      () => navigate(next, { replace: true }),
      (e) => {
        applyServerErrors(form, e);
        form.resetField("password", { keepError: true });
        form.setFocus("password");
      },
    ),
  );

  return (
    <AuthShell
      title="Sign in"
      // The sign-up link sits above the form: the e-mail field's message appears on blur and would move a link below it mid-click.
      description={
        next !== "/" ? (
          "Sign in to continue where you were going."
        ) : (
          <>
            Welcome back. Sign in with the e-mail your team invited. Starting a new club? <TextLink to="/sign-up">Sign up your club</TextLink>
          </>
        )
      }
      footer={<>New to Loadframe? Your team admin sends you an invitation by e-mail.</>}
    >
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
        <FormError form={form} />
        <Field label="E-mail" error={errors.email?.message}>
          <Input type="email" autoComplete="email" autoFocus placeholder="name@club.org" {...form.register("email")} />
        </Field>
        <div className="flex flex-col gap-1.5">
          <Field label="Password" error={errors.password?.message}>
            <Input type="password" autoComplete="current-password" {...form.register("password")} />
          </Field>
          <div className="text-right text-sm">
            <TextLink to={`/forgot-password${form.watch("email") ? `?email=${encodeURIComponent(form.watch("email"))}` : ""}`}>Forgot password?</TextLink>
          </div>
        </div>
        <Button type="submit" loading={signIn.isPending} className="w-full">
          Sign in
        </Button>
      </form>
    </AuthShell>
  );
}
