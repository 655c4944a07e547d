import { useNavigate, useParams } from "react-router-dom";
import { Button, Field, Input, Spinner } from "@/components/ui";
import { errorMessage } from "@/lib/api";
import { applyServerErrors, FormError, useZodForm } from "@/lib/forms";
import { useCompleteSignup, useSignupLink } from "../api/signup";
import { AuthShell } from "../components/AuthShell";
import { TextLink } from "../components/TextLink";
import { PASSWORD_MIN, signupDetailsSchema } from "../schemas";

/** The confirmed address names the club and its first team and chooses a password. */
export function Component() {
  const { token = "" } = useParams();
  const link = useSignupLink(token);
  const complete = useCompleteSignup(token);
  const navigate = useNavigate();
  const form = useZodForm(signupDetailsSchema, { defaultValues: { name: "", password: "", confirm: "", clubName: "", teamName: "" } });
  const errors = form.formState.errors;

  if (link.isPending)
    return (
      <AuthShell title="Checking your link…">
        <Spinner showLabel label="Checking the link" />
      </AuthShell>
    );
  if (link.isError)
    return (
      <AuthShell title="This link cannot be used" footer={<TextLink to="/sign-up">Ask for a new link</TextLink>}>
        <p className="text-ink-muted">{errorMessage(link.error)}</p>
      </AuthShell>
    );

  const onSubmit = form.handleSubmit(({ confirm: _confirm, ...body }) =>
    complete.mutateAsync(body).then(() => navigate("/billing?welcome=1", { replace: true })).catch((e) => applyServerErrors(form, e)),
  );
  return (
    <AuthShell title="Name your club" description={<>Signing up as <strong className="font-semibold">{link.data.email}</strong> (confirmed). You become the team admin.</>}>
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        <FormError form={form} />
        <Field label="Club" hint="The club, school or program that pays, e.g. Harbour Otters Hockey" error={errors.clubName?.message}>
          <Input autoFocus autoComplete="organization" {...form.register("clubName")} />
        </Field>
        <Field label="First team" hint="You can add more teams on a larger plan, e.g. Otters U18" error={errors.teamName?.message}>
          <Input {...form.register("teamName")} />
        </Field>
        <Field label="Your name" error={errors.name?.message}>
          <Input autoComplete="name" {...form.register("name")} />
        </Field>
        <Field label="Password" hint={`At least ${PASSWORD_MIN} characters`} error={errors.password?.message}>
          <Input type="password" autoComplete="new-password" {...form.register("password")} />
        </Field>
        <Field label="Password again" error={errors.confirm?.message}>
          <Input type="password" autoComplete="new-password" {...form.register("confirm")} />
        </Field>
        <Button type="submit" loading={complete.isPending} className="w-full">
          Create the club
        </Button>
      </form>
    </AuthShell>
  );
}
