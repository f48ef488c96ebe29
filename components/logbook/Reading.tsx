"use client";
/** One logbook entry's reading in words, lengths in the form's unit. */
import type { EntryJson, Len } from "./types";

export function Reading({ e, len }: { e: EntryJson; len: Len }) {
  const d = e.data as Record<string, number | string | null | number[]>;
  if (e.kind === "elongation") return <span>{e.elongationPercent!.toFixed(2)} % over {String(d.pitches)} pitches</span>;
  if (e.kind === "take-up") return <span>{(e.takeUpPosition! * len.scale).toFixed(len.digits)} {len.unit} below the top stop</span>;
  if (e.kind === "links-removed")
    return (
      <span>
        {String(d.links)} links: take-up rises {((d.rise as number) * len.scale).toFixed(len.digits)} {len.unit}
        {d.expectedPosition !== null ? `, expected at ${((d.expectedPosition as number) * len.scale).toFixed(len.digits)} ${len.unit}` : ""}
      </span>
    );
  if (e.kind === "lubrication") return <span>{(d.lubricant as string) ?? "—"}</span>;
  return (
    <span>
      {String(d.findings)}
      {e.photos.map((p) => (
        <a key={p.id} href={p.url} target="_blank" rel="noreferrer" className="ml-2 underline">
          photo
        </a>
      ))}
    </span>
  );
}
