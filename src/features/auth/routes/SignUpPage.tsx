import { useRequestSignup } from "../api/signup";
import { AuthShell } from "../components/AuthShell";
import { EmailLinkForm } from "../components/EmailLinkForm";
import { TextLink } from "../components/TextLink";

/** A new club starts here: the e-mail is confirmed by a link before anything else. */
export function Component() {
  const request = useRequestSignup();
  const sentTo = request.isSuccess ? request.data.email : undefined;

  return (
    <AuthShell
      title={sentTo ? "Check your inbox" : "Start your club on Loadframe"}
      description={sentTo ? undefined : "Your club starts on the free Pond plan: one team, three staff seats, 5 GB of clips. First, confirm your e-mail."}
      footer={<>Already have an account? <TextLink to="/sign-in">Sign in</TextLink></>}
    >
      <EmailLinkForm
        send={request.mutateAsync}
        pending={request.isPending}
        sentTo={sentTo}
        onReset={() => request.reset()}
        label="Your e-mail"
        submitLabel="Send the confirmation link"
        sentNote={(email) => (
          <>
            A link is on its way to {email}. Open it to name your club and choose a password. It works once and expires after 24 hours; look in the spam folder if
            nothing arrives within a few minutes.
          </>
        )}
      />
    </AuthShell>
  );
}
