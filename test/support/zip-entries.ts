import { buffer } from 'node:stream/consumers';
import yauzl from 'yauzl';

/** Name and bytes of every entry of a ZIP held in memory. */
export function unzip(zip: Buffer): Promise<Array<{ name: string; data: Buffer }>> {
  return new Promise((resolve, reject) => {
    yauzl.fromBuffer(zip, { lazyEntries: true }, (error, file) => {
      if (error || !file) return reject(error);
      const entries: Array<{ name: string; data: Buffer }> = [];
      file.on('entry', (entry: yauzl.Entry) => {
        file.openReadStream(entry, (err, stream) => {
          if (err || !stream) return reject(err);
          buffer(stream).then((data) => {
            entries.push({ name: entry.fileName, data });
            file.readEntry();
          }, reject);
        });
      });
      file.on('end', () => resolve(entries));
      file.on('error', reject);
      file.readEntry();
    });
  });
}

/** The file names in a ZIP held in memory, in archive order. */
export async function zipEntryNames(zip: Buffer): Promise<string[]> {
  return (await unzip(zip)).map((e) => e.name);
}
