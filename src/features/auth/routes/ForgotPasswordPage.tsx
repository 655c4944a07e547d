import { useSearchParams } from "react-router-dom";
import { useRequestPasswordReset } from "../api/requestPasswordReset";
import { AuthShell } from "../components/AuthShell";
import { EmailLinkForm } from "../components/EmailLinkForm";
import { TextLink } from "../components/TextLink";

export function Component() {
  const [params] = useSearchParams();
  const request = useRequestPasswordReset();
  const sentTo = request.isSuccess ? request.variables?.email : undefined;

  return (
    <AuthShell
      title={sentTo ? "Check your inbox" : "Forgot your password?"}
      description={sentTo ? undefined : "Enter the e-mail you sign in with and we'll send a link to choose a new password."}
      footer={<TextLink to="/sign-in">Back to sign in</TextLink>}
    >
      <EmailLinkForm
        send={request.mutateAsync}
        pending={request.isPending}
        sentTo={sentTo}
        onReset={() => request.reset()}
        label="E-mail"
        submitLabel="Send reset link"
        initialEmail={params.get("email") ?? ""}
        sentNote={(email) => (
          <>
            If an account exists, a link is on its way to {email}. It works once and expires after an hour; look in the spam folder if nothing arrives within a few
            minutes.
          </>
        )}
      />
    </AuthShell>
  );
}
