// The AppError a call is expected to throw; fails the test when it resolves or throws something else.
import { AppError } from "@/lib/errors";

export async function errorOf(promise: Promise<unknown>): Promise<AppError> {
  try {
    await promise;
  } catch (error) {
    if (error instanceof AppError) return error;
    throw error;
  }
  throw new Error("expected an AppError, but the call succeeded");
}
