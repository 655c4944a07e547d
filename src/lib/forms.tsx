import { zodResolver } from "@hookform/resolvers/zod";
import { useForm, type FieldValues, type FormState, type Path, type UseFormProps, type UseFormReturn } from "react-hook-form";
import type { z } from "zod";
import { Alert } from "@/components/ui/Alert";
import { errorMessage, isApiError } from "./api";

/**
 * react-hook-form driven by a zod schema (the same schema the server checks, where shared).
 * Fields are judged first on submit, then as they change: a message that appeared on blur pushed
 * the links below a field down while the pointer was on its way, and the click was lost.
 */
export function useZodForm<TIn extends FieldValues, TOut extends FieldValues>(
  schema: z.ZodType<TOut, TIn>,
  // NoInfer: the schema alone decides the types; defaultValues must not widen "player" to string.
  props: Omit<UseFormProps<NoInfer<TIn>, unknown, NoInfer<TOut>>, "resolver"> = {},
): UseFormReturn<TIn, unknown, TOut> {
  return useForm<TIn, unknown, TOut>({ resolver: zodResolver(schema), mode: "onSubmit", reValidateMode: "onChange", ...props });
}

/**
 * Puts a failed call's messages where they belong: each `errors[].path` the form knows goes next
 * to its field; anything else (wrong password, conflict, network) becomes the form's own message,
 * shown by <FormError>.
 */
export function applyServerErrors<T extends FieldValues>(form: UseFormReturn<T, unknown, FieldValues>, err: unknown): void {
  const known = new Set(Object.keys(form.getValues()));
  let placed = 0;
  if (isApiError(err)) {
    for (const p of err.errors) {
      if (p.path && known.has(p.path.split(".")[0])) {
        form.setError(p.path as Path<T>, { type: "server", message: p.message }, { shouldFocus: placed === 0 });
        placed++;
      }
    }
  }
  if (placed === 0) form.setError("root.server", { type: isApiError(err) ? err.code : "error", message: errorMessage(err) });
}

/** The form-wide message set by applyServerErrors. */
export function FormError<T extends FieldValues>({ form }: { form: { formState: FormState<T> } }) {
  const message = form.formState.errors.root?.server?.message;
  if (!message) return null;
  return <Alert tone="danger">{message}</Alert>;
}
