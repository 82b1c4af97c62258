-- Runs store their reading count and litres through the train (0014). Fill them for runs
-- recorded before: readings that count (the latest correction is not a void), and the highest
-- (corrected) volume among them, 0 when there is none.
UPDATE runs r SET reading_count = s.n, current_volume_l = s.v
FROM (
  SELECT e.run_id,
         count(*) FILTER (WHERE NOT e.voided)::int AS n,
         coalesce(max(e.vol) FILTER (WHERE NOT e.voided), 0) AS v
  FROM (
    SELECT x.run_id,
           coalesce((SELECT c.kind = 'void' FROM run_reading_corrections c WHERE c.reading_id = x.id ORDER BY c.created_at DESC, c.id DESC LIMIT 1), false) AS voided,
           coalesce((SELECT c.volume_l FROM run_reading_corrections c WHERE c.reading_id = x.id AND c.kind = 'correct' AND c.volume_l IS NOT NULL ORDER BY c.created_at DESC, c.id DESC LIMIT 1), x.volume_l) AS vol
    FROM run_readings x
  ) e
  GROUP BY e.run_id
) s
WHERE r.id = s.run_id;
