import { ROLES, type Role } from '@shared/schema/roles';

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Shop admin',
  author: 'Author',
  lead: 'Lead (reviewer)',
  technician: 'Technician',
  trainer: 'Trainer',
};

/** A row of checkboxes, one per role; at least one must stay ticked (the server checks too). */
export function RolePicker({ value, onChange, legend, disabled }: { value: Role[]; onChange: (roles: Role[]) => void; legend: string; disabled?: boolean }) {
  return (
    <fieldset className="flex flex-wrap gap-x-4 gap-y-1" disabled={disabled}>
      <legend className="sr-only">{legend}</legend>
      {ROLES.map((role) => (
        <label key={role} className="flex min-h-10 items-center gap-2">
          <input
            type="checkbox"
            className="h-5 w-5 accent-[var(--color-signal)]"
            checked={value.includes(role)}
            onChange={(e) => onChange(e.target.checked ? [...value, role] : value.filter((r) => r !== role))}
          />
          {ROLE_LABELS[role]}
        </label>
      ))}
    </fieldset>
  );
}
