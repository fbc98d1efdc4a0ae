/** The fluxlane version from package.json ("0.0.0" when it cannot be read). */
import { readFileSync } from 'node:fs';

export function packageVersion(): string {
  try {
    const pkg = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version?: string };
    return pkg.version ?? '0.0.0';
  } catch {
    return '0.0.0';
  }
}
