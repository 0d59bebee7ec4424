/**
 * Notices an analysis of a note whose text did not change: the server analysed it again because
 * a setting or pneumark.config.json changed. The server does not ask the editor to refresh its
 * inlay hints then (`workspace/inlayHint/refresh`), so hints kept what the old settings gave
 * (a P/F in mmHg after `gasUnit` became kPa, a category of hints just switched off) until the
 * next edit; the extension asks for them again when this says so.
 */
export class ReanalysisTracker {
  private readonly versions = new Map<string, number>();

  /** Records an analysis; true when the same version of that note was analysed before. */
  analysed(uri: string, version: number): boolean {
    const before = this.versions.get(uri);
    this.versions.set(uri, version);
    return before === version;
  }

  closed(uri: string): void {
    this.versions.delete(uri);
  }
}
