/**
 * The page people see while the database is away (503). It needs nothing the outage could take
 * away: no query, no stylesheet to fetch, no script; its styles are the design tokens of
 * src/styles/global.css written inline, and it reloads itself after Retry-After.
 */
export function outagePage(retryAfterSeconds: number): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="refresh" content="${retryAfterSeconds}">
<meta name="robots" content="noindex">
<link rel="icon" type="image/svg+xml" href="/favicon.svg">
<title>Back in a moment · Oxbloom</title>
<style>
  html { font-family: 'IBM Plex Sans', system-ui, -apple-system, 'Segoe UI', sans-serif; color: #221e1a; background: #faf8f5; }
  body { margin: 0; min-height: 100dvh; display: flex; flex-direction: column; }
  header { border-bottom: 1px solid #e3ddd3; background: #fff; }
  header a { display: inline-flex; align-items: center; gap: 0.5rem; padding: 0.75rem 1rem; font-family: 'Source Serif 4', Georgia, serif; font-size: 1.25rem; font-weight: 600; color: #221e1a; text-decoration: none; }
  main { flex: 1; width: 100%; max-width: 36rem; margin: 0 auto; padding: 3rem 1rem; box-sizing: border-box; }
  h1 { font-family: 'Source Serif 4', Georgia, serif; font-weight: 600; font-size: 1.875rem; line-height: 1.2; margin: 0 0 1rem; }
  p { line-height: 1.6; color: #50483e; margin: 0 0 1rem; }
  .note { border-left: 4px solid #8f2f2a; background: #fbf1f0; padding: 0.75rem 1rem; color: #37312a; }
  .btn { display: inline-block; border-radius: 0.375rem; background: #8f2f2a; color: #fff; padding: 0.5rem 1rem; font-weight: 500; text-decoration: none; }
  .btn:hover { background: #74231f; }
  a:focus-visible { outline: 3px solid #2c5d8a; outline-offset: 2px; }
</style>
</head>
<body>
<header><a href="/"><img src="/favicon.svg" alt="" width="28" height="28">Oxbloom</a></header>
<main id="main">
  <h1>Oxbloom is back in a moment</h1>
  <p class="note">Our database is not answering just now, so this page cannot be shown. Everything you saved before is safe.</p>
  <p>This page tries again by itself in ${retryAfterSeconds} seconds. If you were filling in a form, keep this tab open and send it again once Oxbloom is back.</p>
  <p><a class="btn" href="">Try again now</a></p>
</main>
</body>
</html>
`;
}
