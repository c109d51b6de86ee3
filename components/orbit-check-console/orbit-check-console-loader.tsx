"use client";
// The orbit-check page imports the console through this loader: the console runs the whole
// engine (and zod, which reads the request) in the browser, and travels as a chunk of its own.
import dynamic from "next/dynamic";

export const OrbitCheckConsoleLoader = dynamic(() => import("./orbit-check-console").then((m) => m.OrbitCheckConsole), {
  loading: () => (
    <p className="text-sm text-ink-600" aria-busy="true">
      Loading the orbit-check engine…
    </p>
  ),
});
