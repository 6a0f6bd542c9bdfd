// Opening and saving project files. Opening reads and checks and never writes; saving goes through
// the atomic replace, so a failed save leaves the good file as it was. Every outcome is a result
// object with a sentence for the user; nothing throws out of these functions.
import { basename } from 'node:path';
import { isInputError, problemLines } from '../core/base/errors';
import { loadProjectText } from '../core/project/project';
import { MAX_PROJECT_BYTES, PROJECT_FORMAT, PROJECT_VERSION } from '../core/project/schema';
import type { OpenResult, SaveResult } from '../types/bridge';
import { atomicWrite } from './atomic-write';
import { describeFsError, nodeFs, type FsLayer } from './fs-layer';
import { firstInvalidUtf8 } from '../core/project/utf8';

export { PROJECT_FORMAT, PROJECT_VERSION };

/** Checks a project text; throws InputError(field, message) when it is not a usable project. */
export type ProjectChecker = (text: string) => unknown;

export interface ProjectFileOptions {
  fs?: FsLayer;
  /** Largest project file read, in bytes. Default the schema's MAX_PROJECT_BYTES (16 MiB): a project is a few kB. */
  maxBytes?: number;
  /** The full check after the header. Default: src/core/project/project.ts loadProjectText (the one load pipeline). */
  check?: ProjectChecker;
}

export const DEFAULT_PROJECT_FILE_OPTIONS = { maxBytes: MAX_PROJECT_BYTES } as const;

export type HeaderVerdict =
  | { kind: 'ok' }
  | { kind: 'newer'; version: number }
  | { kind: 'bad'; message: string };

/** Reads the header of a project text: is it our format, and a version this build knows? */
export function projectHeader(text: string): HeaderVerdict {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    return { kind: 'bad', message: `it is not valid JSON (${(e as Error).message})` };
  }
  if (typeof json !== 'object' || json === null || Array.isArray(json)) return { kind: 'bad', message: 'it is not a JSON object' };
  const o = json as Record<string, unknown>;
  if (o['format'] !== PROJECT_FORMAT) return { kind: 'bad', message: `format must be "${PROJECT_FORMAT}"` };
  const v = o['version'];
  if (typeof v !== 'number' || !Number.isInteger(v) || v < 1) return { kind: 'bad', message: 'version must be a whole number >= 1' };
  if (v > PROJECT_VERSION) return { kind: 'newer', version: v };
  return { kind: 'ok' };
}

/**
 * Why a project file could not be read, as a phrase that follows the file's name: "does not
 * exist", "is not UTF-8 text (...)". The CLI prints `project file 'NAME' <why>`, the app
 * `Could not open "NAME": it <why>.`
 */
export class ProjectReadError extends Error {
  constructor(
    readonly why: string,
    /** which of the reasons: no file, not a regular file, above the size limit, an error of the read, not UTF-8 */
    readonly kind: ProjectReadFault,
  ) {
    super(why);
    this.name = 'ProjectReadError';
  }
}

export type ProjectReadFault = 'missing' | 'not-a-file' | 'too-large' | 'unreadable' | 'not-utf8';

const tooLarge = (bytes: number, maxBytes: number): ProjectReadError =>
  new ProjectReadError(`is ${bytes} bytes, more than the ${maxBytes} bytes a project file may have`, 'too-large');

/** Bytes of a project file -> its text: strict UTF-8 (the first bad byte named by its offset), a leading byte-order mark dropped. */
export function decodeProjectBytes(bytes: Uint8Array): string {
  const bad = firstInvalidUtf8(bytes);
  if (bad >= 0) throw new ProjectReadError(`is not UTF-8 text (an invalid byte sequence at byte offset ${bad}, starting with 0x${bytes[bad]!.toString(16).toUpperCase().padStart(2, '0')})`, 'not-utf8');
  const text = new TextDecoder('utf-8', { ignoreBOM: true }).decode(bytes); // valid by now
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/**
 * The one way a project file is read, by the app and the CLI alike: a regular file only (a device
 * or a pipe could block forever), at most `maxBytes`, strict UTF-8. Throws ProjectReadError.
 */
export async function readProjectText(path: string, options: Pick<ProjectFileOptions, 'fs' | 'maxBytes'> = {}): Promise<string> {
  const fs = options.fs ?? nodeFs;
  const maxBytes = options.maxBytes ?? DEFAULT_PROJECT_FILE_OPTIONS.maxBytes;
  let buf: Uint8Array;
  try {
    const st = await fs.stat(path);
    if (!st) throw new ProjectReadError('does not exist', 'missing');
    if (!st.isFile) throw new ProjectReadError('is not a regular file', 'not-a-file');
    if (st.size > maxBytes) throw tooLarge(st.size, maxBytes);
    buf = await fs.readFile(path);
  } catch (e) {
    if (e instanceof ProjectReadError) throw e;
    throw new ProjectReadError(`cannot be read: ${describeFsError(e)}`, 'unreadable');
  }
  // the file may have grown between the stat and the read
  if (buf.length > maxBytes) throw tooLarge(buf.length, maxBytes);
  return decodeProjectBytes(buf);
}

export async function openProjectFile(path: string, options: ProjectFileOptions = {}): Promise<OpenResult> {
  const name = basename(path);
  const fail = (why: string): OpenResult => ({ ok: false, canceled: false, message: `Could not open "${name}": ${why}.` });
  let text: string;
  try {
    text = await readProjectText(path, options);
  } catch (e) {
    return fail(e instanceof ProjectReadError ? `it ${e.why}` : 'it cannot be read');
  }
  const header = projectHeader(text);
  if (header.kind === 'newer') {
    return {
      ok: true,
      path,
      text,
      readOnly: true,
      message: `"${name}" was written in project format version ${header.version}; this version of Torquewise reads up to version ${PROJECT_VERSION}. It is open read-only: Save As writes a copy, the file itself is not changed.`,
    };
  }
  try {
    (options.check ?? loadProjectText)(text);
  } catch (e) {
    if (isInputError(e)) return fail(problemLines(e).join('; '));
    return fail('its content could not be read as a project');
  }
  if (header.kind === 'bad') return fail(header.message);
  return { ok: true, path, text, readOnly: false };
}

export async function saveProjectFile(path: string, text: string, options: { fs?: FsLayer; platform?: string } = {}): Promise<SaveResult> {
  const header = projectHeader(text);
  if (header.kind !== 'ok') {
    const why = header.kind === 'bad' ? header.message : `version ${header.version} is newer than ${PROJECT_VERSION}`;
    return { ok: false, canceled: false, message: `Not saved: the project text is not a valid project (${why}). The file on disk is unchanged.` };
  }
  const r = await atomicWrite(path, text.endsWith('\n') ? text : `${text}\n`, options);
  if (!r.ok) return { ok: false, canceled: false, message: r.message };
  return r.warning ? { ok: true, path, warning: r.warning } : { ok: true, path };
}
