/**
 * The start of coilbench's pages, and their Content-Security-Policy: only the page's own
 * inline script and style (pinned by their SHA-256 hashes, W3C CSP Level 3
 * hash sources), audio and scripts from the page's own folder, no network
 * connections, nothing else. A name from a guitar file that smuggled in a
 * script tag could not run. 'wasm-unsafe-eval' lets the page's script compile
 * the WebAssembly FFT kernels it carries (src/math/fft-kernels.ts): W3C CSP
 * Level 3, "wasm-unsafe-eval", allows WebAssembly compilation and nothing
 * else (no eval of JavaScript text); without it a policy that names
 * script-src refuses every WebAssembly module.
 */
import { createHash } from 'node:crypto';
import { escapeHtml } from './escape-html.js';

export function sha256Base64(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('base64');
}

/** The policy for a page whose one inline script and one inline style are `script` and `style`. */
export function renderContentSecurityPolicy(script: string, style: string): string {
  return [
    "default-src 'none'",
    `script-src 'sha256-${sha256Base64(script)}' 'self' 'wasm-unsafe-eval'`,
    `style-src 'sha256-${sha256Base64(style)}'`,
    'img-src data:',
    "media-src 'self'",
    "connect-src 'none'",
    "base-uri 'none'",
    "form-action 'none'",
  ].join('; ');
}

/** The document start shared by coilbench's pages, up to and including `<body>`: policy, generator, no favicon request, title, the one style. */
export function renderPageHead(page: { readonly title: string; readonly script: string; readonly style: string; readonly generator: string }): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="${escapeHtml(renderContentSecurityPolicy(page.script, page.style))}">
<meta name="generator" content="${escapeHtml(page.generator)}">
<link rel="icon" href="data:,">
<title>${escapeHtml(page.title)}</title>
<style>${page.style}</style>
</head>
<body>`;
}
