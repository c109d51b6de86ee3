import { requireUser } from "@/lib/auth/session";
import { getMeeting, meetingRevision, type MeetingView } from "@/lib/dal/meetings";
import { isAppError } from "@/lib/errors";
import { onMeetingSignal } from "@/lib/meetings/signal";
import { parseWith, route, searchParamsObject } from "@/lib/http/api";
import { meetingEventsQuerySchema } from "@/lib/validation/meetings";

export const dynamic = "force-dynamic";

/** How often an open stream asks whether the meeting changed (one indexed row read). */
const POLL_MS = 600;
/** A comment line this often keeps proxies and the browser from closing an idle stream. */
const HEARTBEAT_MS = 15_000;
/** Rebuild the view this often even without a new revision (a conflict declared meanwhile). */
const REFRESH_MS = 10_000;

const encoder = new TextEncoder();
const meetingEvent = (view: MeetingView) => encoder.encode(`event: meeting\nid: ${view.revision}\ndata: ${JSON.stringify(view)}\n\n`);

/**
 * The meeting as server-sent events: the viewer's view at once, then again whenever the chair
 * (or a member's presence) changes it. Authorization is checked on connect and on every poll
 * (a member removed from the board gets a `closed` event and the stream ends). `?once=1` sends
 * the current view and closes (for programs that only want one look).
 */
export const GET = route(async (request, { boardId, callId }) => {
  const user = await requireUser();
  const query = parseWith(meetingEventsQuerySchema, searchParamsObject(request), 400);
  let view = await getMeeting(user, boardId!, callId!);
  const headers = {
    "content-type": "text/event-stream; charset=utf-8",
    // no-transform: the server's compression would otherwise hold events back.
    "cache-control": "no-cache, no-store, no-transform",
    "x-accel-buffering": "no",
  };
  if (query.once) return new Response(meetingEvent(view), { headers });

  let timer: ReturnType<typeof setTimeout> | undefined;
  let closed = false;
  let unsubscribe = () => {};
  const stream = new ReadableStream<Uint8Array>({
    start(controller) {
      const close = () => {
        if (closed) return;
        closed = true;
        if (timer) clearTimeout(timer);
        unsubscribe();
        request.signal.removeEventListener("abort", close);
        try {
          controller.close();
        } catch {
          // already closed by the client
        }
      };
      const send = (bytes: Uint8Array) => {
        if (closed) return;
        try {
          controller.enqueue(bytes);
        } catch {
          close(); // the client went away between two looks
        }
      };
      request.signal.addEventListener("abort", close);
      send(encoder.encode("retry: 1000\n\n"));
      send(meetingEvent(view));
      let lastSent = Date.now();
      let lastBuilt = Date.now();
      let running = false;
      let again = false;
      const tick = async () => {
        if (closed) return;
        // One look at a time; a signal during a look asks for one more right after it.
        if (running) {
          again = true;
          return;
        }
        running = true;
        if (timer) clearTimeout(timer);
        try {
          const revision = (await meetingRevision(user, boardId!, callId!)) ?? 0;
          const now = Date.now();
          if (revision !== view.revision || now - lastBuilt > REFRESH_MS) {
            const next = await getMeeting(user, boardId!, callId!);
            lastBuilt = now;
            if (next.revision !== view.revision || JSON.stringify(next) !== JSON.stringify(view)) {
              view = next;
              send(meetingEvent(view));
              lastSent = now;
            }
          }
          if (now - lastSent > HEARTBEAT_MS) {
            send(encoder.encode(": heartbeat\n\n"));
            lastSent = now;
          }
        } catch (error) {
          const message = isAppError(error) ? error.message : "The meeting stream stopped; reload the page to reconnect.";
          if (!isAppError(error)) console.error("[meeting events]", error);
          send(encoder.encode(`event: closed\ndata: ${JSON.stringify({ error: message })}\n\n`));
          close();
          return;
        } finally {
          running = false;
        }
        if (closed) return;
        if (again) {
          again = false;
          void tick();
        } else timer = setTimeout(() => void tick(), POLL_MS);
      };
      unsubscribe = onMeetingSignal(callId!, () => void tick());
      timer = setTimeout(() => void tick(), POLL_MS);
    },
    cancel() {
      closed = true;
      if (timer) clearTimeout(timer);
      unsubscribe();
    },
  });
  return new Response(stream, { headers });
});
