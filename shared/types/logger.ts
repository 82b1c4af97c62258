import type { LoggerMapping } from '../schemas/logger';
import type { ReadingValuesDto } from './runs';

export type LoggerProfileDto = {
  id: string;
  name: string;
  mapping: LoggerMapping;
  createdByName: string | null;
  createdAt: string;
  updatedAt: string;
};

/** One row of a logger file as read, in stored units (bar, L, L/h, °C). */
export type LoggerRowDto = ReadingValuesDto & {
  /** The row in the file, counted as a spreadsheet does (the header row is 1). */
  row: number;
};

/** What is wrong with one row; `column` is the header of the cell at fault, if one is. */
export type LoggerRowErrorDto = { row: number; column: string | null; message: string };

/** `?dryRun=true`: the file as read, nothing stored. */
export type LoggerPreviewDto = {
  /** The first rows as read. */
  rows: LoggerRowDto[];
  /** The per-row errors (the first ones; `errorCount` counts all). */
  errors: LoggerRowErrorDto[];
  /** ΔP against litres, thinned to a few hundred points for drawing. */
  chart: { volumeL: number; dpBar: number }[];
  rowCount: number;
  errorCount: number;
  /** The header row the columns were found in. */
  headers: string[];
  /** SHA-256 of the file; the same file on the same stage is imported once. */
  fingerprint: string;
  /** This file was already imported into this run's stage: importing again adds nothing. */
  alreadyImported: boolean;
};

export type LoggerImportResultDto = {
  imported: number;
  skipped: number;
  /** The original file, kept as an attachment of the run. */
  attachmentId: string | null;
};
