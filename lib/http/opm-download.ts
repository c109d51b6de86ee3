/** A CCSDS OPM (KVN) file download. */
export function opmDownload(out: { text: string; filename: string }): Response {
  return new Response(out.text, {
    status: 200,
    headers: {
      "content-type": "text/plain; charset=utf-8",
      "content-disposition": `attachment; filename="${out.filename.replace(/[^A-Za-z0-9._-]/g, "-")}"`,
      "cache-control": "private, no-store",
      "x-content-type-options": "nosniff",
    },
  });
}
