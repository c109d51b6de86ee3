import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { boardOpenForRegistration } from "@/lib/dal/boards";
import { RegisterForm } from "./_components/register-form";

export const metadata: Metadata = { title: "Register as a proposer" };

// The segment is named boardId because Next.js allows one name per dynamic segment under
// /boards; here it also accepts the board's short name (slug), which is what gets shared.
export default async function RegisterPage({ params }: { params: Promise<{ boardId: string }> }) {
  const { boardId } = await params;
  const board = await boardOpenForRegistration(decodeURIComponent(boardId));
  if (!board) notFound();
  return (
    <div className="mx-auto max-w-lg rounded-panel border border-ink-200 bg-white p-6 shadow-panel">
      <p className="text-sm font-semibold uppercase tracking-widest text-trajectory-600">Open registration</p>
      <h1 className="mb-2 text-xl font-bold">Propose to the {board.name}</h1>
      {board.description ? <p className="mb-4 text-ink-700">{board.description}</p> : null}
      <p className="mb-4 text-sm text-ink-600">Registering creates a VisViva account with the proposer role on this board only.</p>
      <RegisterForm board={board.slug} />
    </div>
  );
}
