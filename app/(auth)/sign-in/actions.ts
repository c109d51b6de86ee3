"use server";
import { publicAction } from "@/lib/actions/action";
import { actionClientAddress } from "@/lib/auth/page-guard";
import { requestSignInLink } from "@/lib/dal/accounts";
import { signInLinkRequestSchema } from "@/lib/validation/accounts";

export const requestSignInLinkAction = publicAction(signInLinkRequestSchema, async (input) =>
  requestSignInLink(input, { ipAddress: await actionClientAddress() }),
);
