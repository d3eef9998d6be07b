/** Saves text as a file from the browser: a Blob behind a temporary object URL and an anchor with `download`. */
export function downloadText(filename: string, text: string, mime = "text/csv;charset=utf-8"): void {
  const url = URL.createObjectURL(new Blob([text], { type: mime }));
  const anchor = document.createElement("a");
  anchor.href = url;
  anchor.download = filename;
  anchor.style.display = "none";
  document.body.appendChild(anchor);
  anchor.click();
  anchor.remove();
  // Revoke after the click has been handled; revoking at once cancels the download in some browsers.
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
