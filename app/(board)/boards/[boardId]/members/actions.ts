"use server";
import { action } from "@/lib/actions/action";
import { actionClientAddress } from "@/lib/auth/page-guard";
import { createInvitation, revokeInvitation } from "@/lib/dal/invitations";
import { updateMember } from "@/lib/dal/members";
import { inviteMemberFormSchema, revokeInvitationFormSchema, updateMemberFormSchema } from "@/lib/validation/accounts";

export const inviteMemberAction = action(inviteMemberFormSchema, async ({ boardId, ...input }, user) => {
  // The link travels only in the e-mail, never back to the browser.
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  const { token, ...invitation } = await createInvitation(user, boardId, input, { ipAddress: await actionClientAddress() });
  return invitation;
});

export const updateMemberAction = action(updateMemberFormSchema, async ({ boardId, memberId, role, status }, user) =>
  updateMember(user, boardId, memberId, { role, status }, { ipAddress: await actionClientAddress() }),
);

export const revokeInvitationAction = action(revokeInvitationFormSchema, async ({ boardId, invitationId }, user) =>
  revokeInvitation(user, boardId, invitationId, { ipAddress: await actionClientAddress() }),
);
