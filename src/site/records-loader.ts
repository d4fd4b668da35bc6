import type { Loader } from 'astro/loaders';
import { statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { collectRecordFiles } from '../log/check-log.ts';

/**
 * Lists the record files for Astro without reading them: groundwork's own parser reads the front matter and reports
 * its problems on the record's page, so one broken record never stops the build the way a failed front-matter parse
 * inside Astro's loader would.
 */
export function recordFiles(folder: string): Loader {
  return {
    name: 'groundwork-records',
    load: async ({ store, watcher, config }) => {
      const root = fileURLToPath(config.root);
      const base = resolve(root, folder);
      const sync = () => {
        store.clear();
        for (const file of collectRecordFiles([base]).files) {
          const path = relative(root, file);
          const id = relative(base, file).replace(/\.md$/, '');
          store.set({ id, data: { file: path }, filePath: path, digest: String(statSync(file).mtimeMs) });
        }
      };
      sync();
      watcher?.on('all', (_event, path) => {
        if (path.startsWith(join(base, '')) && path.endsWith('.md')) sync();
      });
    },
  };
}
