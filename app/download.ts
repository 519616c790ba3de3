/** Hands `blob` to the browser as a download named `fileName` (no server involved). */
export function downloadBlob(fileName: string, blob: Blob): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.style.display = 'none';
  document.body.append(link);
  link.click();
  link.remove();
  // Revoke later: the download has to start reading the URL first.
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
}

/** Saves text as a file of the given MIME type. */
export function downloadText(fileName: string, text: string, type: string): void {
  downloadBlob(fileName, new Blob([text], { type }));
}
