"use server";
import { z } from "zod";
import { action } from "@/lib/actions/action";
import { requeueOutboxMessage } from "@/lib/dal/outbox";

/** "Send again" for a failed message (site admins). */
export const requeueOutboxMessageAction = action(z.object({ messageId: z.uuid("must be a message id") }), async ({ messageId }, user) =>
  requeueOutboxMessage(user, messageId),
);
