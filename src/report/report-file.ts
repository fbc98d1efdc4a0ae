/** A file the report stage writes: its path (as the user gave the folder) and its text. */
export interface ReportFile {
  path: string;
  contents: string;
}
