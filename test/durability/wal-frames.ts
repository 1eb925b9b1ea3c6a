/**
 * Reads the frame headers of an SQLite write-ahead log, to tell after a crash whether a
 * transaction was under way: frames of the current WAL generation that follow its last
 * commit frame were written by a transaction that never committed.
 * Format: https://www.sqlite.org/fileformat2.html#walformat (32-byte header; each frame a
 * 24-byte header — page number, database size after commit (0 if not a commit frame),
 * salt-1, salt-2, checksums — and one page). Frames whose salts differ from the header's
 * are left over from an earlier generation of the log and are not part of it.
 */
import { existsSync, readFileSync } from 'node:fs';

export interface WalFrames {
  /** Frames of the current generation up to and including the last commit frame. */
  committed: number;
  /** Frames after the last commit frame: written by a transaction that did not commit. */
  uncommitted: number;
}

export function readWalFrames(walPath: string): WalFrames {
  if (!existsSync(walPath)) return { committed: 0, uncommitted: 0 };
  const wal = readFileSync(walPath);
  if (wal.length < 32) return { committed: 0, uncommitted: 0 };
  const magic = wal.readUInt32BE(0);
  if (magic !== 0x377f0682 && magic !== 0x377f0683) throw new Error(`${walPath} is not a WAL file (magic ${magic.toString(16)})`);
  const pageSize = wal.readUInt32BE(8);
  const salt1 = wal.readUInt32BE(16);
  const salt2 = wal.readUInt32BE(20);
  let frames = 0;
  let lastCommit = 0;
  for (let offset = 32; offset + 24 + pageSize <= wal.length; offset += 24 + pageSize) {
    if (wal.readUInt32BE(offset + 8) !== salt1 || wal.readUInt32BE(offset + 12) !== salt2) break;
    frames++;
    if (wal.readUInt32BE(offset + 4) !== 0) lastCommit = frames;
  }
  return { committed: lastCommit, uncommitted: frames - lastCommit };
}
