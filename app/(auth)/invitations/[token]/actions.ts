"use server";
import { publicAction } from "@/lib/actions/action";
import { actionClientAddress } from "@/lib/auth/page-guard";
import { acceptInvitation } from "@/lib/dal/invitations";
import { acceptInvitationSchema } from "@/lib/validation/accounts";

/** Public: the single-use token from the e-mail is the credential. */
export const acceptInvitationAction = publicAction(acceptInvitationSchema, async (input) =>
  acceptInvitation(input, { ipAddress: await actionClientAddress() }),
);
