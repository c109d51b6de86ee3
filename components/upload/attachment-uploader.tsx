"use client";
// Attachments: the browser PUTs each file straight to the object store through a
// short-lived presigned URL (XMLHttpRequest, for progress), then asks the server to
// confirm it (size, real type, SHA-256). Per file: a progress bar, cancel and retry (only
// where trying again can help). A file of a type not accepted is refused before any upload,
// with the allowed types listed; a finished upload shows as a file in the attached list.
import { useCallback, useEffect, useRef, useState } from "react";
import { useDropzone, type FileRejection } from "react-dropzone";
import { ATTACHMENT_TYPES } from "@/lib/validation/dossier-vocabulary";

export interface AttachmentItem {
  id: string;
  filename: string;
  contentType: string;
  size: number | null;
  sha256: string | null;
  textKind?: string | null;
  contentPath: string;
}

type UploadStatus = "starting" | "uploading" | "confirming" | "done" | "failed" | "cancelled";

interface Upload {
  key: string;
  file: File;
  status: UploadStatus;
  progress: number;
  error?: string;
  /** False when trying the same file again cannot succeed (refused type, disguised content). */
  retryable?: boolean;
  attachmentId?: string;
}

interface Refusal {
  key: string;
  message: string;
}

const TYPE_NAMES: Record<string, string> = {
  "application/pdf": "PDF",
  "image/png": "PNG",
  "image/jpeg": "JPEG",
  "text/csv": "CSV",
  "text/plain": "plain text, including CCSDS OEM/OPM/OMM messages and two-line element sets",
};

/** The accepted types in words, with their file endings: "PDF (.pdf), PNG (.png), …". */
export const ALLOWED_TYPES_TEXT = Object.entries(ATTACHMENT_TYPES)
  .map(([type, endings]) => `${TYPE_NAMES[type] ?? type} (${endings.join(", ")})`)
  .join("; ");

/** Why the picker or the drop refused a file, as a sentence that says what to do. */
export function refusalMessage(rejection: { file: { name: string }; errors: readonly { code: string; message: string }[] }): string {
  const name = rejection.file.name;
  if (rejection.errors.some((e) => e.code === "file-invalid-type"))
    return `"${name}" was not attached: files of this type are not accepted. Accepted types: ${ALLOWED_TYPES_TEXT}.`;
  return `"${name}" was not attached: ${rejection.errors.map((e) => e.message).join("; ")}.`;
}

/** The allow-listed type for a file, from its name (browsers often report nothing for .oem or .tle). */
export function declaredTypeOf(file: { name: string; type: string }): string {
  const dot = file.name.lastIndexOf(".");
  const ext = dot >= 0 ? file.name.slice(dot).toLowerCase() : "";
  for (const [type, endings] of Object.entries(ATTACHMENT_TYPES)) if (endings.includes(ext)) return type;
  return file.type || "application/octet-stream";
}

const ACCEPT: Record<string, string[]> = Object.fromEntries(Object.entries(ATTACHMENT_TYPES).map(([t, e]) => [t, [...e]]));

function formatSize(n: number | null): string {
  if (n === null) return "";
  if (n >= 1024 * 1024) return `${(n / 1024 / 1024).toFixed(1)} MB`;
  if (n >= 1024) return `${Math.round(n / 1024)} KB`;
  return `${n} B`;
}

async function errorText(response: Response): Promise<string> {
  const body = (await response.json().catch(() => null)) as { error?: string } | null;
  return body?.error ?? `The server answered ${response.status}.`;
}

export function AttachmentUploader({
  boardId,
  proposalId,
  attachments,
  editable,
  onAttachmentsChange,
}: {
  boardId: string;
  proposalId: string;
  attachments: AttachmentItem[];
  editable: boolean;
  onAttachmentsChange: (next: AttachmentItem[]) => void;
}) {
  const [uploads, setUploads] = useState<Upload[]>([]);
  const [refusals, setRefusals] = useState<Refusal[]>([]);
  const [justAttached, setJustAttached] = useState<string | null>(null);
  const requests = useRef(new Map<string, XMLHttpRequest>());
  const latest = useRef(attachments);
  useEffect(() => {
    latest.current = attachments;
  }, [attachments]);

  const patch = useCallback((key: string, change: Partial<Upload>) => {
    setUploads((all) => all.map((u) => (u.key === key ? { ...u, ...change } : u)));
  }, []);

  const start = useCallback(
    async (key: string, file: File) => {
      patch(key, { status: "starting", progress: 0, error: undefined });
      const presign = await fetch(`/api/v1/boards/${boardId}/proposals/${proposalId}/attachments`, {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ filename: file.name, contentType: declaredTypeOf(file), size: file.size }),
      }).catch(() => null);
      if (!presign || !presign.ok) {
        // The server refuses a name, type or size for good; only an outage is worth a retry.
        const retryable = !presign || presign.status >= 500 || presign.status === 429;
        patch(key, { status: "failed", error: presign ? await errorText(presign) : "Could not reach the server.", retryable });
        return;
      }
      const { attachment, uploadUrl, headers } = (await presign.json()) as { attachment: { id: string }; uploadUrl: string; headers: Record<string, string> };
      patch(key, { status: "uploading", attachmentId: attachment.id });
      const put = await new Promise<boolean | "aborted">((resolve) => {
        const xhr = new XMLHttpRequest();
        requests.current.set(key, xhr);
        xhr.open("PUT", uploadUrl);
        for (const [h, v] of Object.entries(headers)) xhr.setRequestHeader(h, v);
        xhr.upload.onprogress = (e) => {
          if (e.lengthComputable) patch(key, { progress: Math.min(99, Math.round((e.loaded / e.total) * 100)) });
        };
        xhr.onload = () => resolve(xhr.status >= 200 && xhr.status < 300);
        xhr.onerror = () => resolve(false);
        xhr.onabort = () => resolve("aborted");
        xhr.send(file);
      });
      requests.current.delete(key);
      if (put === "aborted") return;
      if (!put) {
        patch(key, { status: "failed", error: "The upload to storage failed. Retry.", retryable: true });
        return;
      }
      patch(key, { status: "confirming", progress: 100 });
      const confirm = await fetch(`/api/v1/boards/${boardId}/attachments/${attachment.id}/confirm`, { method: "POST" }).catch(() => null);
      if (!confirm || !confirm.ok) {
        const error = confirm ? await errorText(confirm) : "Could not reach the server to confirm the upload.";
        // A file refused after its upload (its content is not what its name says, too large)
        // was removed: sending it again would be refused again, so no Retry is offered.
        const retryable = !confirm || confirm.status >= 500 || confirm.status === 429 || /\bretry\b/i.test(error);
        patch(key, { status: "failed", error, retryable });
        return;
      }
      const confirmed = ((await confirm.json()) as { attachment: AttachmentItem }).attachment;
      // The finished upload leaves the progress list; the file shows in the attached list.
      setUploads((all) => all.filter((u) => u.key !== key));
      setJustAttached(confirmed.id);
      onAttachmentsChange([...latest.current.filter((a) => a.id !== confirmed.id), confirmed]);
    },
    [boardId, proposalId, patch, onAttachmentsChange],
  );

  const cancel = (u: Upload) => {
    requests.current.get(u.key)?.abort();
    patch(u.key, { status: "cancelled" });
    // The pending row and any partial object go now rather than at the next cleanup.
    if (u.attachmentId) void fetch(`/api/v1/boards/${boardId}/attachments/${u.attachmentId}`, { method: "DELETE" }).catch(() => undefined);
  };

  const onDrop = useCallback(
    (files: File[], rejected: FileRejection[]) => {
      setRefusals(rejected.map((r) => ({ key: `${r.file.name}-${Math.random().toString(36).slice(2)}`, message: refusalMessage(r) })));
      for (const file of files) {
        const key = `${file.name}-${file.size}-${Math.random().toString(36).slice(2)}`;
        setUploads((all) => [...all, { key, file, status: "starting", progress: 0 }]);
        void start(key, file);
      }
    },
    [start],
  );

  const { getRootProps, getInputProps, isDragActive } = useDropzone({ onDrop, accept: ACCEPT, disabled: !editable, multiple: true });

  const remove = async (a: AttachmentItem) => {
    const response = await fetch(`/api/v1/boards/${boardId}/attachments/${a.id}`, { method: "DELETE" });
    if (response.ok) onAttachmentsChange(latest.current.filter((x) => x.id !== a.id));
    else window.alert(await errorText(response));
  };

  return (
    <section aria-labelledby="attachments-heading" className="space-y-3 rounded-panel border border-ink-200 bg-white p-4 shadow-panel">
      <h2 id="attachments-heading" className="text-base font-semibold text-ink-900">
        Attachments
      </h2>
      {editable ? (
        <div
          {...getRootProps({
            className: `cursor-pointer rounded-panel border-2 border-dashed p-4 text-center text-sm ${isDragActive ? "border-trajectory-500 bg-trajectory-100" : "border-ink-300 text-ink-600"}`,
          })}
        >
          <input {...getInputProps({ "aria-label": "Choose files to attach" })} />
          <p>Drop files here, or press Enter to choose them.</p>
          <p className="text-xs text-ink-500">Accepted: {ALLOWED_TYPES_TEXT}.</p>
        </div>
      ) : null}
      {refusals.length > 0 ? (
        <div role="alert" className="space-y-1 rounded-chip border border-void-500/40 bg-void-100 p-2 text-sm text-void-700">
          <ul className="space-y-1" aria-label="Files not attached">
            {refusals.map((r) => (
              <li key={r.key}>{r.message}</li>
            ))}
          </ul>
          <button type="button" onClick={() => setRefusals([])} className="rounded-chip border border-void-500/50 bg-white px-2 text-xs">
            Dismiss
          </button>
        </div>
      ) : null}
      {uploads.filter((u) => u.status !== "done").length > 0 ? (
        <ul className="space-y-2" aria-label="Uploads in progress">
          {uploads
            .filter((u) => u.status !== "done")
            .map((u) => (
              <li key={u.key} className="space-y-1 text-sm" data-upload-status={u.status}>
                <div className="flex items-center justify-between gap-2">
                  <span className="truncate font-mono text-xs">{u.file.name}</span>
                  <span className="flex gap-1">
                    {["starting", "uploading"].includes(u.status) ? (
                      <button type="button" onClick={() => cancel(u)} className="rounded-chip border border-ink-300 px-2 text-xs">
                        Cancel
                      </button>
                    ) : null}
                    {u.status === "cancelled" || (u.status === "failed" && u.retryable) ? (
                      <button type="button" onClick={() => void start(u.key, u.file)} className="rounded-chip border border-ink-300 px-2 text-xs">
                        Retry
                      </button>
                    ) : null}
                    {["failed", "cancelled"].includes(u.status) ? (
                      <button
                        type="button"
                        onClick={() => setUploads((all) => all.filter((x) => x.key !== u.key))}
                        className="rounded-chip border border-ink-300 px-2 text-xs"
                      >
                        Dismiss
                      </button>
                    ) : null}
                  </span>
                </div>
                {u.status === "failed" || u.status === "cancelled" ? null : <UploadBar upload={u} />}
                {u.error ? (
                  <p role="alert" className="text-xs text-void-700">
                    {u.error}
                  </p>
                ) : null}
                {u.status === "cancelled" ? <p className="text-xs text-ink-500">Cancelled.</p> : null}
              </li>
            ))}
        </ul>
      ) : null}
      {attachments.length === 0 ? (
        <p className="text-sm text-ink-600">No attachments yet.</p>
      ) : (
        <ul className="divide-y divide-ink-100 text-sm" aria-label="Attached files">
          {attachments.map((a) => (
            <li key={a.id} className="flex items-center justify-between gap-2 py-1.5" data-just-attached={a.id === justAttached ? "" : undefined}>
              <a href={a.contentPath} className="truncate text-trajectory-700 hover:underline" title={a.sha256 ? `SHA-256 ${a.sha256}` : undefined}>
                {a.filename}
              </a>
              <span className="flex shrink-0 items-center gap-2 text-xs text-ink-500">
                {a.id === justAttached ? (
                  <span role="status" className="rounded-chip bg-holds-100 px-1.5 text-holds-700">
                    Attached
                  </span>
                ) : null}
                {a.textKind ? <span className="rounded-chip bg-ink-100 px-1.5">{a.textKind}</span> : null}
                {formatSize(a.size)}
                {editable ? (
                  <button type="button" onClick={() => void remove(a)} className="rounded-chip border border-ink-300 px-2" aria-label={`Remove ${a.filename}`}>
                    Remove
                  </button>
                ) : null}
              </span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}

function UploadBar({ upload }: { upload: Upload }) {
  const label = { starting: "Starting", uploading: "Uploading", confirming: "Checking", done: "Uploaded", failed: "Failed", cancelled: "Cancelled" }[
    upload.status
  ];
  return (
    <div className="flex items-center gap-2">
      <div
        role="progressbar"
        aria-label={`Upload of ${upload.file.name}`}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={upload.progress}
        aria-valuetext={`${label}, ${upload.progress}%`}
        className="h-2 flex-1 overflow-hidden rounded-full bg-ink-100"
      >
        <div
          className={`h-full ${upload.status === "failed" ? "bg-void-500" : upload.status === "done" ? "bg-holds-500" : "bg-trajectory-500"}`}
          style={{ width: `${upload.progress}%` }}
        />
      </div>
      <span className="w-28 text-right text-2xs text-ink-600">
        {label} {upload.progress}%
      </span>
    </div>
  );
}
