'use server';

import { revalidatePath } from 'next/cache';
import { getActor } from '@/lib/auth/actor';
import { toActionState, type ActionState } from '@/lib/errors';
import { updateUserAccess } from '@/lib/services/accounts';

/** Admins: gives a user another role (audited). */
export async function changeUserRole(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    const user = await updateUserAccess(await getActor(), formData.get('userId'), { role: formData.get('role') ?? undefined });
    revalidatePath('/admin/users');
    return { ok: true, message: `${user.email ?? 'The account'} is now ${user.role === 'admin' ? 'an' : 'a'} ${user.role}.` };
  } catch (err) {
    return toActionState(err);
  }
}

/** Admins: disables an account (signing it out everywhere) or enables it again (audited). */
export async function setUserDisabled(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    const user = await updateUserAccess(await getActor(), formData.get('userId'), { disabled: formData.get('disabled') ?? undefined });
    revalidatePath('/admin/users');
    return { ok: true, message: `${user.email ?? 'The account'} is ${user.disabled ? 'disabled and signed out' : 'enabled again'}.` };
  } catch (err) {
    return toActionState(err);
  }
}
