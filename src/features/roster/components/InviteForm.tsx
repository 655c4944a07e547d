import { InviteBodySchema } from "@shared/schemas/roster";
import { Button, Card, Field, Input, toast } from "@/components/ui";
import { isApiError } from "@/lib/api";
import { applyServerErrors, FormError, useZodForm } from "@/lib/forms";
import { roleMeaning } from "@/lib/roles";
import { useInviteMember } from "../api/inviteMember";
import { RoleSelect } from "./RoleSelect";

export function InviteForm({ teamId, teamName }: { teamId: string; teamName: string }) {
  const invite = useInviteMember(teamId);
  const form = useZodForm(InviteBodySchema, { defaultValues: { email: "", role: "player" } });
  const { errors } = form.formState;
  const role = form.watch("role");

  const onSubmit = form.handleSubmit((values) =>
    invite.mutateAsync(values).then(
      () => {
        toast.success(`We've e-mailed ${values.email} a link to join ${teamName}.`, "Invitation sent");
        form.reset({ email: "", role: values.role });
      },
      (e) => {
        // "already a member" / "already invited" are about the address typed, so show them there.
        if (isApiError(e) && (e.code === "already_member" || e.code === "already_invited") && e.errors.length === 0) {
          form.setError("email", { type: e.code, message: e.detail }, { shouldFocus: true });
        } else applyServerErrors(form, e);
      },
    ),
  );

  return (
    <Card title="Invite someone" description={`They get an e-mail with a link to join ${teamName}.`}>
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        <FormError form={form} />
        <Field label="E-mail" error={errors.email?.message}>
          <Input type="email" autoComplete="off" placeholder="name@club.org" {...form.register("email")} />
        </Field>
        <Field label="Role" hint={roleMeaning[role]} error={errors.role?.message}>
          <RoleSelect {...form.register("role")} />
        </Field>
        <Button type="submit" loading={invite.isPending} className="self-start">
          Send invitation
        </Button>
      </form>
    </Card>
  );
}
