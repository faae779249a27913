// Hands a file made in the page to the browser as a download.

/** Saves `blob` as a file named `name`. */
export function downloadBlob(name, blob) {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = name;
  document.body.append(link);
  link.click();
  link.remove();
  // After the click has been handled: revoking at once can cancel the download.
  setTimeout(() => URL.revokeObjectURL(url), 30_000);
}
