"use client";
import { useEffect } from "react";
import { startServiceWorkerWhenSettled } from "@/client/service-worker";

/** In the root layout: every page registers the service worker once it has settled. */
export function ServiceWorkerStart() {
  useEffect(() => startServiceWorkerWhenSettled(), []);
  return null;
}
