// Messages about an uploaded file as a whole that the browser and the server both give, word for word.

/** A file of 0 bytes: said as soon as it is chosen in the browser, and again by the server. */
export function emptyFileMessage(filename: string): string {
  return `${filename} is empty (0 bytes): the file holds nothing to import. Export the plate from the instrument again and upload that file.`;
}
