// `npm start`: build the client and server bundles if they are missing, then serve them.
import { isBuilt } from './ssr/pages';

if (!isBuilt()) {
  console.log('No build yet — building the screens (one time)…');
  const { build } = await import('vite');
  await build({ logLevel: 'warn', build: { outDir: 'dist/client' } });
  await build({ logLevel: 'warn', build: { ssr: 'src/entry-server.tsx', outDir: 'dist/server' } });
}
await import('./index');
