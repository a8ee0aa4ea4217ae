"use client";
import { useLiveQuery } from "@/client/live-query";
import { queryStateOf, type QueryState } from "@/lib/club/thread";
import type { LodebookDb } from "./device-db";

/**
 * The member's finds with an open or answered query, by find id: the marks in the finds list
 * and on Today. Reviews and answers are few (only those of the member's own finds).
 */
export function useQueryStates(db: LodebookDb): Map<string, Extract<QueryState, "queried" | "answered">> | undefined {
  return useLiveQuery(() => readQueryStates(db), [db]);
}

export async function readQueryStates(db: LodebookDb): Promise<Map<string, Extract<QueryState, "queried" | "answered">>> {
  const [reviews, answers] = await Promise.all([db.reviews.toArray(), db.answers.toArray()]);
  const byFind = new Map<string, typeof reviews>();
  for (const r of reviews) byFind.set(r.findId, [...(byFind.get(r.findId) ?? []), r]);
  const states = new Map<string, "queried" | "answered">();
  for (const [findId, list] of byFind) {
    const { state } = queryStateOf(
      list,
      answers.filter((a) => a.findId === findId),
    );
    if (state === "queried" || state === "answered") states.set(findId, state);
  }
  return states;
}
