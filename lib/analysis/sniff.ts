import { chooseDataStart, isBlank, splitLine, withoutTrailingEmpties, type DataStart } from "./dialect";
import { diagnoseNoData, rejectHexHeader, rejectOpenQuote } from "./head-diagnosis";
import { addMetadata, emptyMetadata, isIntervalName, isStartName, readMetadataLine, timeBaseFromMetadata, type Metadata } from "./preamble";
import { CaptureRejection } from "./rejection";
import { suggestChannelRoles } from "./roles";
import { isBareUnitCell, isIndexName, looksLikeTimeHeader, readHeaderUnit, type HeaderUnit } from "./units";
import { isNumericCell, readNumericCell } from "./number-syntax";
import type { ChannelRole } from "./types";

export interface CaptureLayout {
  delimiter: string;
  decimal: "." | ",";
  /** 0-based index of the first data row among the lines given. */
  dataStartIndex: number;
  /** Columns set aside at the start of every row (key / value / unit metadata beside the data). */
  leadingColumns: number;
  /** Every used column after the leading ones, as written ("CH1"… when the file has no header row). */
  headers: string[];
  units: HeaderUnit[];
  timeColumn: number | null;
  /** The time column counts samples: time = start + value × sample interval. */
  timeIsIndex: boolean;
  metadata: Record<string, string>;
  /** From the preamble or header region (sample interval or rate), when given there. */
  preambleSampleRateHz: number | null;
  /** Time of sample index 0, when the preamble or header region gives it. */
  statedStartS: number | null;
  suggestedRoles: Record<string, ChannelRole>;
}

/** When there is no header row: a first column that rises in even steps is taken as time. */
function evenFirstColumn(rows: number[][]): { step: number; integers: boolean } | null {
  if (rows.length < 3 || (rows[0]?.length ?? 0) < 2) return null;
  const first = rows.map((row) => row[0] ?? Number.NaN);
  const step = (first[1] ?? 0) - (first[0] ?? 0);
  if (!(step > 0)) return null;
  const even = first.every((value, index) => index === 0 || Math.abs(value - (first[index - 1] ?? 0) - step) <= 0.01 * step);
  return even ? { step, integers: first.every((value) => Number.isInteger(value)) } : null;
}

function cellsOf(line: string | undefined, delimiter: string, skip: number): string[] {
  return withoutTrailingEmpties(splitLine(line ?? "", delimiter)).slice(skip);
}

/** Header, units row and header-region time base (Start / Increment cells beyond the data columns). */
/** A comment line or a "key: number" entry: preamble, not a header row. */
function isPreambleLine(line: string): boolean {
  return /^\s*[#%]/.test(line) || /^[^:=]*[^\s:=][^:=]*[:=]\s*[-+]?[\d.,]/.test(line.trim());
}

function readHeaderRegion(lines: string[], found: DataStart, decimal: "." | ",") {
  const { delimiter } = found.dialect;
  let headerIndex = found.start - 1;
  while (headerIndex >= 0 && isBlank(lines[headerIndex] ?? "", delimiter)) headerIndex--;
  if (headerIndex >= 0 && found.skip === 0 && isPreambleLine(lines[headerIndex] ?? "")) {
    return { headerIndex: -1, metadataEnd: headerIndex + 1, headers: [] as string[], unitRow: null, intervalS: null, startS: null };
  }
  let unitRow: string[] | null = null;
  let intervalS: number | null = null;
  let startS: number | null = null;
  if (headerIndex >= 1) {
    const cells = cellsOf(lines[headerIndex], delimiter, found.skip);
    const names = cellsOf(lines[headerIndex - 1], delimiter, found.skip);
    const within = cells.slice(0, found.width);
    const beyond = cells.slice(found.width);
    const timeBaseBeyond = beyond.every((cell, i) => cell === "" || (isNumericCell(cell, decimal) && (isStartName(names[found.width + i] ?? "") || isIntervalName(names[found.width + i] ?? ""))));
    if (within.length > 0 && within.every((cell) => cell === "" || isBareUnitCell(cell)) && timeBaseBeyond && names.length >= within.length && !names.slice(0, found.width).some((cell) => isNumericCell(cell, decimal))) {
      unitRow = within;
      beyond.forEach((cell, i) => {
        if (cell === "") return;
        const name = names[found.width + i] ?? "";
        if (isStartName(name)) startS = readNumericCell(cell, decimal);
        else intervalS = readNumericCell(cell, decimal);
      });
      headerIndex--;
    }
  }
  let headers = headerIndex >= 0 ? cellsOf(lines[headerIndex], delimiter, found.skip) : [];
  if (headers.length > found.width && headers.slice(found.width).every((cell) => cell === "" || isStartName(cell) || isIntervalName(cell))) {
    headers = headers.slice(0, found.width);
  }
  if (headerIndex >= 0) {
    rejectOpenQuote(lines[headerIndex] ?? "", headerIndex + 1, lines[headerIndex - 1]);
    rejectHexHeader(headers, headerIndex + 1);
  }
  return { headerIndex, metadataEnd: Math.max(headerIndex, 0), headers, unitRow: unitRow as string[] | null, intervalS: intervalS as number | null, startS: startS as number | null };
}

function readMetadata(lines: string[], found: DataStart, headerIndex: number, metadataEnd: number): Metadata {
  const { delimiter } = found.dialect;
  const metadata = emptyMetadata();
  for (let index = 0; index < metadataEnd; index++) {
    const entry = readMetadataLine(lines[index] ?? "", delimiter);
    if (entry) addMetadata(metadata, entry[0], entry[1], index + 1);
  }
  if (found.skip > 0) {
    for (let index = Math.max(headerIndex, 0); index < lines.length; index++) {
      const lead = withoutTrailingEmpties(splitLine(lines[index] ?? "", delimiter)).slice(0, found.skip);
      if (lead[0]) addMetadata(metadata, lead[0].replace(/[:=]\s*$/, ""), lead.slice(1).filter((c) => c !== "").join(" "), index + 1);
    }
  }
  return metadata;
}

/** Works out the dialect, preamble, header and time base from the first lines of a capture. */
export function sniffLines(lines: string[]): CaptureLayout {
  if (lines.every((line) => line.trim() === "")) throw new CaptureRejection("empty", "The file is empty");
  const found = chooseDataStart(lines);
  if (!found) diagnoseNoData(lines);
  const { delimiter, decimal } = found.dialect;
  const region = readHeaderRegion(lines, found, decimal);
  const metadata = readMetadata(lines, found, region.headerIndex, region.metadataEnd);
  const hasHeader = region.headers.length > 0;
  const width = Math.max(found.width, region.headers.length);
  const headers = Array.from({ length: width }, (_, index) => region.headers[index] || `CH${index + 1}`);
  const units = headers.map((header, index) => {
    const unit = readHeaderUnit(header);
    const rowUnit = region.unitRow?.[index];
    if (unit.written === null && rowUnit && !isIndexName(rowUnit)) {
      const fromRow = readHeaderUnit(`${header} (${rowUnit.replace(/^[([]\s*|\s*[)\]]$/g, "")})`);
      return { ...fromRow, name: unit.name };
    }
    return unit;
  });
  const stated = timeBaseFromMetadata(metadata, decimal);
  const intervalS = region.intervalS ?? stated.intervalS;
  if (intervalS !== null && !(intervalS > 0)) {
    throw new CaptureRejection("bad-sample-interval", `The header gives a sample interval of ${intervalS}: a sample interval must be positive`, { line: region.headerIndex + 2 });
  }
  let timeIsIndex = false;
  let timeColumn: number | null = headers.findIndex((header, index) => isIndexName(readHeaderUnit(header).name) || isIndexName(region.unitRow?.[index] ?? "-"));
  if (timeColumn >= 0) timeIsIndex = true;
  else timeColumn = units.findIndex((unit) => looksLikeTimeHeader(unit));
  if (timeColumn < 0) timeColumn = null;
  const rows = lines
    .slice(found.start, found.start + 8)
    .filter((line) => !isBlank(line, delimiter))
    .map((line) => cellsOf(line, delimiter, found.skip).map((cell) => readNumericCell(cell, decimal)));
  // A bare "X" column counting 0, 1, 2… beside a stated sample interval is a sample index, not seconds.
  if (timeColumn !== null && !timeIsIndex && intervalS !== null && /^x$/i.test(headers[timeColumn] ?? "")) {
    const even = evenFirstColumn(rows.map((row) => row.slice(timeColumn as number)));
    timeIsIndex = even !== null && even.integers && even.step === 1;
  }
  if (!hasHeader) {
    const even = evenFirstColumn(rows);
    if (even) {
      timeIsIndex = even.integers && even.step === 1 && intervalS !== null;
      headers[0] = timeIsIndex ? "index" : "time";
      units[0] = { name: headers[0], kind: "time", factor: 1, written: null };
      timeColumn = 0;
    }
  }
  const channelHeaders = headers.filter((_, index) => index !== timeColumn);
  return {
    delimiter,
    decimal,
    dataStartIndex: found.start,
    leadingColumns: found.skip,
    headers,
    units,
    timeColumn,
    timeIsIndex,
    metadata: metadata.values,
    preambleSampleRateHz: intervalS !== null ? 1 / intervalS : null,
    statedStartS: region.startS ?? stated.startS,
    suggestedRoles: suggestChannelRoles(channelHeaders),
  };
}
