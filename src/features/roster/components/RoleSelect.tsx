import { Select, type SelectProps } from "@/components/ui/Input";
import { ROLES, roleLabel } from "@/lib/roles";

export function RoleSelect(props: SelectProps) {
  return (
    <Select {...props}>
      {ROLES.map((r) => (
        <option key={r} value={r}>
          {roleLabel[r]}
        </option>
      ))}
    </Select>
  );
}
