import { useNavigate, useParams } from "react-router-dom";
import { Alert, Badge, Button, ButtonLink, Field, Input, Spinner } from "@/components/ui";
import { isApiError } from "@/lib/api";
import { formatDate } from "@/lib/format";
import { applyServerErrors, FormError, useZodForm } from "@/lib/forms";
import { roleLabel, roleMeaning } from "@/lib/roles";
import { useMe } from "@/lib/session";
import { useAcceptInvitation } from "../api/acceptInvitation";
import { useInvitation, type InvitationView } from "../api/invitation";
import { useSignOut } from "../api/signOut";
import { AuthShell } from "../components/AuthShell";
import { TextLink } from "../components/TextLink";
import { acceptSchema, PASSWORD_MIN } from "../schemas";

const backToSignIn = <TextLink to="/sign-in">Go to sign in</TextLink>;

export function Component() {
  const { id = "" } = useParams();
  const invitation = useInvitation(id);
  const me = useMe();

  if (invitation.isPending || me.isPending) {
    return (
      <AuthShell title="Opening your invitation…">
        <Spinner showLabel label="Checking the link" />
      </AuthShell>
    );
  }

  if (invitation.isError) {
    const e = invitation.error;
    const code = isApiError(e) ? e.code : "";
    if (code === "invitation_expired")
      return (
        <AuthShell title="This invitation has expired" footer={backToSignIn}>
          <p className="text-ink-muted">Invitations are valid for a limited time. Ask your team admin to send a new one; the fresh link will work straight away.</p>
        </AuthShell>
      );
    if (code === "invitation_used")
      return (
        <AuthShell title="This invitation was already used">
          <div className="flex flex-col gap-5">
            <p className="text-ink-muted">
              Someone has accepted it already — probably you. {me.data ? "Your teams are in the team switcher at the top." : "Sign in to reach the team."}
            </p>
            <ButtonLink to={me.data ? "/" : "/sign-in"} variant="primary" className="w-full">
              {me.data ? "Go to Loadframe" : "Sign in"}
            </ButtonLink>
          </div>
        </AuthShell>
      );
    if (isApiError(e) && e.status === 404)
      return (
        <AuthShell title="This invitation link isn't valid" footer={backToSignIn}>
          <p className="text-ink-muted">It may have been cancelled, or the link was cut short when copied. Ask your team admin to send it again.</p>
        </AuthShell>
      );
    return (
      <AuthShell title="We couldn't open this invitation" footer={backToSignIn}>
        <div className="flex flex-col gap-5">
          <Alert tone="danger">{isApiError(e) ? e.detail : "Something went wrong."}</Alert>
          <Button variant="secondary" onClick={() => invitation.refetch()}>
            Try again
          </Button>
        </div>
      </AuthShell>
    );
  }

  const inv = invitation.data;
  const signedInAs = me.data?.user.email;
  const isInvitee = !!signedInAs && signedInAs.toLowerCase() === inv.email.toLowerCase();

  return (
    <AuthShell title={`Join ${inv.teamName}`} description={<>{inv.inviterName} invited you to Loadframe.</>}>
      <div className="flex flex-col gap-6">
        <InvitationSummary inv={inv} />
        {isInvitee ? (
          <JoinAsSignedIn inv={inv} />
        ) : signedInAs ? (
          <WrongAccount signedInAs={signedInAs} inv={inv} />
        ) : inv.hasAccount ? (
          <div className="flex flex-col gap-4">
            <p className="text-sm text-ink-muted">
              You already have a Loadframe account for <strong className="font-semibold text-ink">{inv.email}</strong>. Sign in and you'll come
              straight back here to join.
            </p>
            <ButtonLink to={`/sign-in?next=${encodeURIComponent(`/invite/${inv.id}`)}&email=${encodeURIComponent(inv.email)}`} variant="primary" className="w-full">
              Sign in to join
            </ButtonLink>
          </div>
        ) : (
          <NewAccountForm inv={inv} />
        )}
      </div>
    </AuthShell>
  );
}

function InvitationSummary({ inv }: { inv: InvitationView }) {
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2 rounded-lg bg-sunken/70 px-4 py-3 text-sm">
      <dt className="text-ink-muted">Team</dt>
      <dd className="font-medium">{inv.teamName}</dd>
      <dt className="text-ink-muted">Your role</dt>
      <dd>
        <Badge tone="accent">{roleLabel[inv.role]}</Badge>
        <p className="mt-1 text-ink-muted">{roleMeaning[inv.role]}</p>
      </dd>
      <dt className="text-ink-muted">Invited by</dt>
      <dd>{inv.inviterName}</dd>
      <dt className="text-ink-muted">For</dt>
      <dd className="break-all">{inv.email}</dd>
      <dt className="text-ink-muted">Valid until</dt>
      <dd>{formatDate(inv.expiresAt)}</dd>
    </dl>
  );
}

function JoinAsSignedIn({ inv }: { inv: InvitationView }) {
  const accept = useAcceptInvitation();
  const navigate = useNavigate();
  return (
    <div className="flex flex-col gap-4">
      {accept.isError && <Alert tone="danger">{isApiError(accept.error) ? accept.error.detail : "Couldn't join the team."}</Alert>}
      <Button
        loading={accept.isPending}
        className="w-full"
        onClick={() => accept.mutate({ id: inv.id }, { onSuccess: () => navigate("/", { replace: true, state: { joinedTeam: inv.teamName } }) })}
      >
        Join team
      </Button>
    </div>
  );
}

function WrongAccount({ signedInAs, inv }: { signedInAs: string; inv: InvitationView }) {
  const signOut = useSignOut();
  return (
    <div className="flex flex-col gap-4">
      <Alert tone="warn" title="You're signed in with another e-mail">
        This browser is signed in as <strong className="font-semibold">{signedInAs}</strong>, but the invitation is for{" "}
        <strong className="font-semibold">{inv.email}</strong>. Sign out to accept it.
      </Alert>
      <Button variant="secondary" loading={signOut.isPending} onClick={() => signOut.mutate()}>
        Sign out and continue
      </Button>
    </div>
  );
}

function NewAccountForm({ inv }: { inv: InvitationView }) {
  const accept = useAcceptInvitation();
  const navigate = useNavigate();
  const form = useZodForm(acceptSchema, { defaultValues: { name: "", password: "", confirm: "" } });
  const { errors } = form.formState;
  const onSubmit = form.handleSubmit(({ name, password }) =>
    accept.mutateAsync({ id: inv.id, name, password }).then(
      () => navigate("/", { replace: true, state: { joinedTeam: inv.teamName } }),
      (e) => applyServerErrors(form, e),
    ),
  );
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
      <p className="text-sm text-ink-muted">Create your account to accept. You'll sign in with {inv.email}.</p>
      <FormError form={form} />
      {/* Lets password managers store the new password under the right address. */}
      <input type="email" name="username" autoComplete="username" value={inv.email} readOnly hidden />
      <Field label="Your name" hint="As your team will see it on the roster and on shared shots." error={errors.name?.message}>
        <Input autoComplete="name" autoFocus {...form.register("name")} />
      </Field>
      <Field label="Password" hint={`At least ${PASSWORD_MIN} characters.`} error={errors.password?.message}>
        <Input type="password" autoComplete="new-password" {...form.register("password")} />
      </Field>
      <Field label="Password again" error={errors.confirm?.message}>
        <Input type="password" autoComplete="new-password" {...form.register("confirm")} />
      </Field>
      <Button type="submit" loading={accept.isPending} className="w-full">
        Create account and join
      </Button>
    </form>
  );
}
