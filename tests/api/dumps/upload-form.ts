/** A multipart upload as the Uploads page sends it: the fields first, then the file. */
export async function uploadForm(
  url: string,
  headers: Record<string, string>,
  fields: Record<string, string | number>,
  file: { bytes: Uint8Array | string; name?: string } | null,
  options: { fileFirst?: boolean } = {},
): Promise<Response> {
  const form = new FormData();
  const addFile = () => {
    if (file) form.append('file', new Blob([file.bytes]), file.name ?? 'dump.bin');
  };
  if (options.fileFirst) addFile();
  for (const [key, value] of Object.entries(fields)) form.append(key, String(value));
  if (!options.fileFirst) addFile();
  return fetch(url, { method: 'POST', headers, body: form });
}
