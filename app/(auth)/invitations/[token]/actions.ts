"use server";
import { publicAction } from "@/lib/actions/action";
import { actionClientAddress } from "@/lib/auth/page-guard";
import { currentUser } from "@/lib/auth/session";
import { acceptInvitation } from "@/lib/dal/invitations";
import { acceptInvitationSchema } from "@/lib/validation/accounts";

/**
 * Public: the single-use token from the e-mail is the credential for a new account. For an
 * address that already has an account, the caller must also be signed in as it.
 */
export const acceptInvitationAction = publicAction(acceptInvitationSchema, async (input) =>
  acceptInvitation(input, { ipAddress: await actionClientAddress(), user: await currentUser() }),
);
