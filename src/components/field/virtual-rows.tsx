"use client";
import type { ReactElement } from "react";
import { Virtualizer } from "virtua";

type Props<T> = { data: T[]; itemSize: number; children: (item: T) => ReactElement };

/** A list of fixed-height rows of which only those in view (and a few around) are in the page. */
export function VirtualRows<T>({ data, itemSize, children }: Props<T>) {
  return (
    <Virtualizer as="ul" item="li" data={data} itemSize={itemSize} bufferSize={itemSize * 8}>
      {children}
    </Virtualizer>
  );
}
