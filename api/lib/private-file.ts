import { chmod, mkdir, readFile, stat, writeFile } from 'node:fs/promises';
import { join } from 'node:path';

/**
 * A secret kept as JSON in `dir/fileName` (mode 0600): made by `make` the first time, read and
 * checked by `parse` after that. Two processes starting together keep one value ('wx' fails when
 * the file exists), and a copied-in file readable by others is made private again.
 */
export async function loadOrCreatePrivateJson<T>(
  dir: string,
  fileName: string,
  make: () => T,
  parse: (text: string, path: string) => T,
): Promise<T> {
  const path = join(dir, fileName);
  await mkdir(dir, { recursive: true });
  const created = make();
  try {
    await writeFile(path, `${JSON.stringify(created, null, 2)}\n`, { flag: 'wx', mode: 0o600 });
    return created;
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
  }
  if (((await stat(path)).mode & 0o077) !== 0) await chmod(path, 0o600);
  return parse(await readFile(path, 'utf8'), path);
}
