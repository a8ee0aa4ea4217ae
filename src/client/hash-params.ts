"use client";
import { usePathname } from "next/navigation";
import { useEffect, useState } from "react";

function readHash(): URLSearchParams {
  return new URLSearchParams(typeof window === "undefined" ? "" : window.location.hash.slice(1));
}

/**
 * Parameters of the member screens ride in the URL's hash (`/finds/view#id=…`): the page the
 * service worker stored for the path then serves any record, with no signal.
 */
export function useHashParams(): URLSearchParams {
  const pathname = usePathname();
  const [params, setParams] = useState<URLSearchParams>(() => new URLSearchParams());
  useEffect(() => {
    const read = () => setParams(readHash());
    queueMicrotask(read);
    window.addEventListener("hashchange", read);
    window.addEventListener("popstate", read);
    return () => {
      window.removeEventListener("hashchange", read);
      window.removeEventListener("popstate", read);
    };
  }, [pathname]);
  return params;
}
