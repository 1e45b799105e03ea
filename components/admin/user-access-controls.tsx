'use client';

import { useActionState } from 'react';
import { changeUserRole, setUserDisabled } from '@/app/admin/users/actions';
import { Button } from '@/components/ui';
import type { ActionState } from '@/lib/errors';
import type { Role } from '@/lib/policies';
import { FormMessage } from '@/components/account/form-message';

export type UserAccessControlsProps = {
  userId: string;
  /** Who the controls are for, for labels ("Role for ada@example.org"). */
  label: string;
  role: Role;
  roles: readonly Role[];
  disabled: boolean;
  /** False for one's own row: nobody disables themselves. */
  canDisable: boolean;
};

/** One user's role select and disable/enable button, each its own small form. */
export function UserAccessControls({ userId, label, role, roles, disabled, canDisable }: UserAccessControlsProps) {
  const [roleState, roleAction, rolePending] = useActionState<ActionState, FormData>(changeUserRole, { ok: false });
  const [disState, disAction, disPending] = useActionState<ActionState, FormData>(setUserDisabled, { ok: false });
  const selectId = `role-${userId}`;
  return (
    <div className="flex flex-col gap-2">
      <form action={roleAction} className="flex flex-wrap items-end gap-2">
        <input type="hidden" name="userId" value={userId} />
        <div className="flex flex-col gap-1">
          <label htmlFor={selectId} className="text-sm font-semibold">
            Role<span className="sr-only"> for {label}</span>
          </label>
          <select
            id={selectId}
            name="role"
            defaultValue={role}
            className="min-h-touch rounded-md border border-line-strong bg-surface-raised px-2 text-base text-ink"
          >
            {roles.map((r) => (
              <option key={r} value={r}>
                {r}
              </option>
            ))}
          </select>
        </div>
        <Button type="submit" variant="secondary" disabled={rolePending}>
          {rolePending ? 'Saving…' : 'Change role'}
          <span className="sr-only"> for {label}</span>
        </Button>
      </form>
      <FormMessage state={{ ...roleState, message: roleState.fieldErrors?.role?.[0] ?? roleState.message }} />
      {canDisable ? (
        <form action={disAction}>
          <input type="hidden" name="userId" value={userId} />
          <input type="hidden" name="disabled" value={disabled ? 'false' : 'true'} />
          <Button type="submit" variant={disabled ? 'secondary' : 'danger'} disabled={disPending}>
            {disabled ? 'Enable account' : 'Disable account'}
            <span className="sr-only"> of {label}</span>
          </Button>
          <FormMessage state={disState} className="mt-1" />
        </form>
      ) : (
        <p className="text-sm text-ink-muted">This is you: another admin can change your access.</p>
      )}
    </div>
  );
}
