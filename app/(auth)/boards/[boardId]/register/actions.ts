"use server";
import { publicAction } from "@/lib/actions/action";
import { actionClientAddress } from "@/lib/auth/page-guard";
import { registerProposer } from "@/lib/dal/accounts";
import { registerProposerSchema } from "@/lib/validation/accounts";

/** Public, and only for boards whose chair opened registration to proposers. */
export const registerProposerAction = publicAction(registerProposerSchema, async (input) =>
  registerProposer(input, { ipAddress: await actionClientAddress() }),
);
