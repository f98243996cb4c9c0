/**
 * The audio the listening page plays, in a form a page opened from file://
 * can read. Chromium blocks fetch() and XHR of file:// URLs, and a
 * MediaElementAudioSourceNode fed from a file:// <audio> outputs silence
 * ("outputs zeroes due to CORS access restrictions"), so Web Audio cannot
 * take the WAV directly. A classic <script src> from the page's own folder
 * does load; so beside each `wav/<name>.wav` the render writes
 * `wav/<name>.wav.js`, a script that hands the same WAV bytes (base64) to the
 * page, which decodes them with decodeAudioData.
 */
import { serializeJsonForScript } from './escape-html.js';

/** Name of the function the page defines and each audio script calls. */
export const PAGE_AUDIO_CALLBACK = 'coilbenchAudio';

/** Where the page looks for a wiring's audio script: the WAV path with ".js" added ("wav/w9-neck.wav" → "wav/w9-neck.wav.js"). */
export function pageAudioPath(wavPath: string): string {
  return `${wavPath}.js`;
}

/**
 * Content of `pageAudioPath(wav)`: one call `coilbenchAudio("w9", "<base64 of the WAV file>");`.
 * `wavBytes` are the bytes of any PCM or float WAV Chromium decodes (the file
 * written to `wav/`, or a 16-bit copy to save space). Pure; the caller writes it.
 */
export function renderPageAudioScript(wiringId: string, wavBytes: Uint8Array): string {
  const base64 = Buffer.from(wavBytes.buffer, wavBytes.byteOffset, wavBytes.byteLength).toString('base64');
  return `${PAGE_AUDIO_CALLBACK}(${serializeJsonForScript(wiringId)}, "${base64}");\n`;
}
