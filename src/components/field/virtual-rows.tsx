"use client";
import type { ReactElement } from "react";
import { Virtualizer } from "virtua";

type Props<T> = { data: T[]; itemSize: number; firstCount: number; children: (item: T) => ReactElement };

/**
 * A list of fixed-height rows of which only those in view (and a few around) are in the page.
 * `firstCount` rows are drawn on its first render, before it has measured its box (virtua's
 * `ssrCount`): it takes over from plain rows drawn while it loaded, and without them the list
 * was empty between its mount and its first measure.
 */
export function VirtualRows<T>({ data, itemSize, firstCount, children }: Props<T>) {
  return (
    <Virtualizer as="ul" item="li" data={data} itemSize={itemSize} bufferSize={itemSize * 8} ssrCount={Math.min(firstCount, data.length)}>
      {children}
    </Virtualizer>
  );
}
