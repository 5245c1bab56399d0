/**
 * Hands a file to the browser as a download named `fileName` (the results are here, or were just
 * fetched): a link to an object URL, clicked once, revoked after the click has been handled.
 */
export function saveFile(fileName: string, file: Blob): void {
  const url = URL.createObjectURL(file);
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  document.body.append(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 0);
}
