"use server";
import { z } from "zod";
import { action } from "@/lib/actions/action";
import { actionClientAddress } from "@/lib/auth/page-guard";
import { changePassword, signOutOtherSessions } from "@/lib/dal/accounts";
import { changePasswordSchema } from "@/lib/validation/accounts";

export const changePasswordAction = action(changePasswordSchema, async (input, user) =>
  changePassword(user, input, { ipAddress: await actionClientAddress() }),
);

export const revokeOtherSessionsAction = action(z.object({}), async (_input, user) => signOutOtherSessions(user, { ipAddress: await actionClientAddress() }));
