"use server";
import { publicAction } from "@/lib/actions/action";
import { actionClientAddress } from "@/lib/auth/page-guard";
import { requestPasswordReset, requestSignInLink } from "@/lib/dal/accounts";
import { passwordResetRequestSchema, signInLinkRequestSchema } from "@/lib/validation/accounts";

export const requestSignInLinkAction = publicAction(signInLinkRequestSchema, async (input) =>
  requestSignInLink(input, { ipAddress: await actionClientAddress() }),
);

export const requestPasswordResetAction = publicAction(passwordResetRequestSchema, async (input) =>
  requestPasswordReset(input, { ipAddress: await actionClientAddress() }),
);
