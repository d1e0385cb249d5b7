/**
 * The anchor for the trace: the rows the trace page shows for one parameter (its value in every
 * version, and the newest changes with their assessment, narrative, requirements, signatures and
 * evidence runs with samples, signatures and files), read with hand-written SQL straight through
 * the driver, with none of the service's shaping. The service's time is reported against it.
 */
import type { Client } from "@libsql/client";

export async function rawTraceRows(client: Client, recipeId: string, key: string, newest: number) {
  const values = await client.execute({
    sql: `select v.id, v.version, v.status, v.effective_from, v.effective_to, v.notes, v.created_at, u.name as author,
                 p.name, p.setpoint, p.unit, p.validated_low, p.validated_high, p.critical, s.name as stage
          from recipe_versions v
          left join users u on u.id = v.created_by
          left join recipe_parameters p on p.version_id = v.id and p.key = ?
          left join recipe_stages s on s.id = p.stage_id
          where v.recipe_id = ? order by v.version`,
    args: [key, recipeId],
  });
  // The newest changes that brought a version of this recipe, with what the page prints of each.
  const changes = await client.execute({
    sql: `select c.*, a.revision, a.content_hash as assessed_hash, a.computed_impact, a.raised_to,
                 dv.content as narrative,
                 (select json_group_array(json_array(key, setpoint, validated_low, validated_high))
                   from recipe_parameters where version_id = c.from_version_id) as from_parameters,
                 (select json_group_array(json_array(key, setpoint, validated_low, validated_high))
                   from recipe_parameters where version_id = c.to_version_id) as to_parameters
          from change_requests c
          join change_request_assessments a on a.change_request_id = c.id
          left join document_versions dv on dv.document_id = c.narrative_document_id
          where c.recipe_id = ? and c.to_version_id is not null
          order by c.created_at desc limit ?`,
    args: [recipeId, newest],
  });
  const ids = changes.rows.map((r) => String(r.id));
  const marks = ids.map(() => "?").join(",");
  if (ids.length === 0) return values.rows.length;
  const requirements = await client.execute({
    sql: `select * from change_request_tests where change_request_id in (${marks})`,
    args: ids,
  });
  const signatures = await client.execute({
    sql: `select s.* from change_requests c join signatures s
            on s.record_type = 'change_request' and s.record_id >= c.id || '#' and s.record_id < c.id || '$'
          where c.id in (${marks})`,
    args: ids,
  });
  const evidence = await client.execute({
    sql: `select t.change_request_id, r.*,
                 (select count(*) from test_samples x where x.run_id = r.id) as samples,
                 (select count(*) from test_samples x where x.run_id = r.id and x.worst_case) as worst,
                 (select json_group_array(json_array(meaning, printed_name, signed_at)) from signatures g
                   where g.record_type = 'test_run' and g.record_id = r.id) as signatures,
                 (select json_group_array(json_array(original_name, size_bytes, sha256)) from evidence_files e
                   where e.run_id = r.id) as files
          from change_request_tests t
          join change_request_evidence l on l.requirement_id = t.id
          join test_runs r on r.id = l.test_run_id
          where t.change_request_id in (${marks})`,
    args: ids,
  });
  return (
    values.rows.length +
    changes.rows.length +
    requirements.rows.length +
    signatures.rows.length +
    evidence.rows.length
  );
}

/**
 * The trace page's reads (the choosers' names, the recipe's parameters and the newest timeline
 * entries) beside the raw SQL for the same rows, alternately, `repeat` times each after a warm-up.
 */
export async function measureTracePair(
  client: Client,
  input: { recipeId: string; key: string },
  repeat = 20,
) {
  const {
    forgetParameterHistories,
    getParameterHistory,
    listTraceableParameters,
    listTraceScopes,
  } = await import("@/lib/server/trace/parameter-history");
  const { TRACE_ENTRIES_PAGE } = await import("@/lib/schemas/trace");
  const page = () =>
    Promise.all([
      listTraceScopes(),
      listTraceableParameters({ recipeId: input.recipeId }),
      getParameterHistory(input, { newest: TRACE_ENTRIES_PAGE }),
    ]);
  const raw = () => rawTraceRows(client, input.recipeId, input.key, TRACE_ENTRIES_PAGE);
  await page();
  await raw();
  const pageMs: number[] = [];
  const coldMs: number[] = [];
  const rawMs: number[] = [];
  for (let i = 0; i < repeat; i++) {
    // Cold: the history read in full, as after any write. Warm: read again under the same
    // audit chain head, as a second reader of an unchanged trace gets it.
    forgetParameterHistories();
    let t = performance.now();
    await page();
    coldMs.push(performance.now() - t);
    t = performance.now();
    await page();
    pageMs.push(performance.now() - t);
    t = performance.now();
    await raw();
    rawMs.push(performance.now() - t);
  }
  const q = (ms: number[], p: number) =>
    [...ms].sort((a, b) => a - b)[Math.min(ms.length - 1, Math.ceil(p * ms.length) - 1)];
  return {
    page: { p50: q(pageMs, 0.5), p95: q(pageMs, 0.95) },
    cold: { p50: q(coldMs, 0.5), p95: q(coldMs, 0.95) },
    raw: { p50: q(rawMs, 0.5), p95: q(rawMs, 0.95) },
  };
}
