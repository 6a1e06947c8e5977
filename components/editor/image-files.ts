/** Image files carried by a drop or paste (the upload endpoint checks the content itself). */
export function imageFilesFrom(transfer: DataTransfer | null | undefined): File[] {
  if (!transfer) return [];
  return [...transfer.files].filter((file) => file.type.startsWith("image/"));
}
