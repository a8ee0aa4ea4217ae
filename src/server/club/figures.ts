import "server-only";
import { sql, type SQL } from "drizzle-orm";
import type { Db } from "../db";

type Tx = Pick<Db, "run">;

/**
 * Keeps the ledger's figures on each find row: the latest weigh-in's server estimate and the
 * latest verify or query. Called wherever those change (push, reviews, seeding).
 */
function refresh(where: SQL): SQL {
  return sql`
    update finds set
      latest_alloy_grams = (select w.gold_alloy_grams from weigh_ins w where w.find_id = finds.id and w.deleted_at is null order by w.weighed_at desc, w.id desc limit 1),
      latest_fine_grams = (select w.fine_gold_grams from weigh_ins w where w.find_id = finds.id and w.deleted_at is null order by w.weighed_at desc, w.id desc limit 1),
      latest_fine_low = (select json_extract(w.server_estimate, '$.range.fineGoldGrams[0]') from weigh_ins w where w.find_id = finds.id and w.deleted_at is null order by w.weighed_at desc, w.id desc limit 1),
      latest_fine_high = (select json_extract(w.server_estimate, '$.range.fineGoldGrams[1]') from weigh_ins w where w.find_id = finds.id and w.deleted_at is null order by w.weighed_at desc, w.id desc limit 1),
      review_state = coalesce((select case r.action when 'verify' then 'verified' else 'queried' end from reviews r where r.find_id = finds.id and r.action in ('verify','query') order by r.created_at desc, r.seq desc limit 1), 'new')
    where ${where}`;
}

export function refreshFindFigures(tx: Tx, findId: string): void {
  tx.run(refresh(sql`id = ${findId}`));
}

export function refreshAllFigures(tx: Tx): void {
  tx.run(refresh(sql`1 = 1`));
}
