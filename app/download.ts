/** Saves text as a file through the browser's download (no server involved). */
export function downloadText(fileName: string, text: string, type: string): void {
  const blob = new Blob([text], { type });
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  document.body.append(link);
  link.click();
  link.remove();
  // The click has started the download; release the blob after the browser has taken it.
  setTimeout(() => URL.revokeObjectURL(url), 0);
}
