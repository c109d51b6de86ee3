"use server";
import { publicAction } from "@/lib/actions/action";
import { actionClientAddress } from "@/lib/auth/page-guard";
import { resetPassword } from "@/lib/dal/accounts";
import { passwordResetSchema } from "@/lib/validation/accounts";

export const resetPasswordAction = publicAction(passwordResetSchema, async (input) => resetPassword(input, { ipAddress: await actionClientAddress() }));
