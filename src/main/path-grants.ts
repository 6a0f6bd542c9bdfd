// The paths the user picked in a dialog (or opened) during this session. Main writes only to
// these; a path the renderer makes up is refused. Kept in memory only: nothing carries over.
import { resolve } from 'node:path';

export class PathGrants {
  private readonly granted = new Set<string>();
  private readonly caseInsensitive: boolean;

  constructor(platform: string = process.platform) {
    this.caseInsensitive = platform === 'win32' || platform === 'darwin';
  }

  private key(path: string): string {
    const abs = resolve(path);
    return this.caseInsensitive ? abs.toLowerCase() : abs;
  }

  grant(path: string): void {
    this.granted.add(this.key(path));
  }

  revoke(path: string): void {
    this.granted.delete(this.key(path));
  }

  has(path: string): boolean {
    return this.granted.has(this.key(path));
  }

  get size(): number {
    return this.granted.size;
  }
}
