// The production server: Astro's Node adapter in middleware mode (astro.config.mjs) behind a plain
// node:http server, the way the adapter's documentation shows. Files of the build's client folder
// (public/ and the /_astro/ assets, listed once at start) are sent with `send`, as the adapter's
// standalone server sends them; every other request goes straight to Astro. The standalone server
// looked on disk for a file before every page and API request (two failed stat calls each), a sixth
// of the server's time under load (`npm run bench -- load`).
//
//   node scripts/serve.mjs [outDir]      (outDir: OXBLOOM_OUT_DIR or ./dist; HOST and PORT as usual)
import { readdirSync } from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import send from 'send';

const outDir = path.resolve(process.argv[2] ?? process.env.OXBLOOM_OUT_DIR ?? 'dist');
const client = path.join(outDir, 'client');
const { handler, options } = await import(pathToFileURL(path.join(outDir, 'server', 'entry.mjs')).href);

/** Hashed build assets never change under their name. */
const ASSETS = `/${options.assets ?? '_astro'}/`;

/** Every file under `dir`, as the URL path that names it ("/favicon.svg", "/_astro/…"). */
function urlPathsUnder(dir) {
  return readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((entry) => entry.isFile())
    .map((entry) => `/${path.relative(dir, path.join(entry.parentPath, entry.name)).split(path.sep).join('/')}`);
}
const files = new Set(urlPathsUnder(client));

function sendFile(req, res, pathname) {
  const stream = send(req, pathname, { root: client });
  if (pathname.startsWith(ASSETS)) stream.on('headers', (response) => response.setHeader('Cache-Control', 'public, max-age=31536000, immutable'));
  stream.on('error', (error) => {
    res.statusCode = error.status ?? 500;
    res.end();
  });
  stream.pipe(res);
}

/** The app's body cap (src/lib/server/request-limits.ts): larger bodies are refused there, unread. */
const READ_AHEAD_MAX_BYTES = 64 * 1024;

/**
 * A JSON body for one of our API routes, within the cap by its declared length, is read here and
 * handed to Astro as text in `locals.bodyText`. The adapter (patched, scripts/patches/) then builds
 * the request without a body stream, and the routes read the text through lib/server/http.ts:
 * building a web stream over a small body and draining it again cost about a seventh of such a
 * request's server CPU (DEVELOPERS.md has the figures). Auth.js's routes read their bodies themselves, so theirs
 * stream as before, as does anything else (no length, over the cap, not JSON); the middleware caps it.
 */
function readsAhead(req, pathname) {
  const length = Number(req.headers['content-length']);
  return (
    length > 0 &&
    length <= READ_AHEAD_MAX_BYTES &&
    pathname.startsWith('/api/') &&
    !pathname.startsWith('/api/auth/') &&
    /^application\/json\s*(;|$)/i.test(req.headers['content-type'] ?? '')
  );
}

/** UTF-8 as `request.text()` decodes it: a leading byte-order mark dropped, bad bytes replaced. */
const utf8 = new TextDecoder();

function readAheadThenHandle(req, res) {
  const chunks = [];
  req.on('data', (chunk) => chunks.push(chunk));
  req.on('end', () => handler(req, res, undefined, { bodyText: utf8.decode(Buffer.concat(chunks)) }));
}

const server = http.createServer((req, res) => {
  const url = req.url ?? '/';
  const end = url.search(/[?#]/);
  const rawPath = end === -1 ? url : url.slice(0, end);
  let pathname;
  try {
    decodeURI(url);
    pathname = decodeURIComponent(rawPath);
  } catch {
    res.writeHead(400).end('Bad request.');
    return;
  }
  if ((req.method === 'GET' || req.method === 'HEAD') && files.has(pathname)) sendFile(req, res, rawPath);
  else if (readsAhead(req, pathname)) readAheadThenHandle(req, res);
  else handler(req, res);
});

const host = process.env.HOST ?? (typeof options.host === 'string' ? options.host : options.host ? '0.0.0.0' : 'localhost');
const port = Number(process.env.PORT ?? options.port ?? 8080);
server.listen(port, host, () => console.log(`[oxbloom] serving ${outDir} at http://${host}:${port}`));
