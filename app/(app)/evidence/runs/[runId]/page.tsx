import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { getDb } from "@/db/client";
import { notFound } from "next/navigation";
import { DeviationList } from "@/components/deviations/deviation-list";
import { CsvImport } from "@/components/evidence/csv-import";
import { FileUpload } from "@/components/evidence/file-upload";
import { LabDetailsForm } from "@/components/lab-report/lab-details-form";
import { OutcomePanel } from "@/components/evidence/outcome-panel";
import { SamplePager } from "@/components/evidence/sample-pager";
import { DetachFileForm, RemoveSampleButton, ReviseForm } from "@/components/evidence/run-actions";
import { RunDataForm, SampleForm } from "@/components/evidence/sample-form";
import { OutcomeWord, RunStatusWord } from "@/components/evidence/status-word";
import { SignatureDialog } from "@/components/signatures/signature-dialog";
import { SignatureList } from "@/components/signatures/signature-list";
import { Caution } from "@/components/ui/caution";
import { PageHeader } from "@/components/ui/page-header";
import { testEntryCautions } from "@/lib/lab-report/cautions";
import { can } from "@/lib/auth/permissions";
import { env } from "@/lib/env";
import { isCsvTestType } from "@/lib/evidence/csv-import";
import { describeSample } from "@/lib/evidence/describe";
import { readSamplePage, samplePage } from "@/lib/evidence/sample-page";
import { formatSize } from "@/lib/format/number";
import { humanize } from "@/lib/format/labels";
import type { ParticleRunData } from "@/lib/schemas/evidence";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { deviationsCoveringRun } from "@/lib/server/deviations/queries";
import { getRunDetail } from "@/lib/server/evidence/queries";
import { RunNonconformances } from "@/components/nonconformances/run-nonconformances";
import { RunInstruments } from "@/components/instruments/run-instruments";
import {
  addSampleAction,
  detachFileAction,
  removeSampleAction,
  reviseRunAction,
  saveRunDataAction,
  signRunAction,
} from "../../actions";
import { formatDate, formatDateTime } from "@/lib/format/date";
import { citeMethodsAction, saveLabDetailsAction } from "./actions";
import { CiteMethodsForm } from "@/components/lab-methods/cite-methods-form";
import { labDetailsFromMethods } from "@/lib/lab-methods/prefill";
import { LAB_METHOD_KIND_LABELS } from "@/lib/schemas/lab-method";
import { METHOD_KINDS_BY_TEST } from "@/lib/lab-methods/kinds";
import { getRunMethods } from "@/lib/server/evidence/run-methods";
import { approvedMethods } from "@/lib/server/lab-methods/queries";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { recordTitle } from "@/lib/server/page-titles";

export async function generateMetadata({
  params,
}: {
  params: Promise<{ runId: string }>;
}): Promise<Metadata> {
  return recordTitle("run", (await params).runId, "Test run");
}

export default async function RunPage({
  params,
  searchParams,
}: {
  params: Promise<{ runId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await requirePageUser("evidence.view");
  const { runId } = await params;
  const requestedPage = readSamplePage((await searchParams).samples);
  const detail = /^[0-9a-f-]{36}$/.test(runId) ? await getRunDetail(runId) : undefined;
  if (!detail) notFound();
  const { run, family, spec, recipe, version, outcome, samples, files, signatures, revisions } =
    detail;
  const covering = await deviationsCoveringRun({
    recipeVersionId: run.recipeVersionId,
    partFamilyId: run.partFamilyId,
    performedOn: run.performedOn,
  });
  const open = run.status === "open";
  const mayRecord = open && can(user.roles, "evidence.record");
  const label = `${run.number} revision ${run.revision}`;
  const performedBy = signatures.find((s) => s.meaning === "performed");
  const runData = (run.runData ?? { extractionSeries: [], blank: null }) as ParticleRunData;
  // The outcome is computed over every sample; the page shows one page of them and of their working.
  const shown = samplePage(samples, requestedPage);
  const worked = samplePage(outcome.samples, requestedPage);
  const runPath = `/evidence/runs/${run.id}`;
  const methodKinds = METHOD_KINDS_BY_TEST[run.testType] ?? [];
  const [cited, citable] = await Promise.all([
    getRunMethods(getDb(), run.id),
    mayRecord && methodKinds.length ? approvedMethods() : Promise.resolve([]),
  ]);
  return (
    <>
      <PageHeader
        title={`${run.number}${run.revision > 1 ? ` rev ${run.revision}` : ""} · ${humanize(run.testType)}`}
        description={
          <span className="flex flex-wrap gap-x-4 gap-y-1">
            <RunStatusWord status={run.status} />
            <span>
              {family.code} · {family.name}
            </span>
            <span>
              {recipe.code} v{version.version}
            </span>
          </span>
        }
      />
      {covering.length > 0 && (
        <section
          aria-labelledby="run-deviations"
          className="mb-4 rounded-md border border-stone-300 bg-stone-50 p-3"
        >
          <h2 id="run-deviations" className="mb-1 text-sm font-semibold">
            Made under a temporary deviation
          </h2>
          <p className="mb-2 text-sm text-stone-700">
            On {formatDate(run.performedOn, "today")} this recipe and part family ran under the
            temporary values below: the process was permitted outside its validated range, so read
            this result as evidence of that temporary process.
          </p>
          <DeviationList label="Deviations covering this run" items={covering} />
        </section>
      )}
      <RunNonconformances runId={run.id} />
      {run.status === "superseded" && (
        <p className="mb-4 rounded-md border border-stone-300 bg-stone-100 px-3 py-2 text-sm">
          This revision has been superseded.{" "}
          <IntentLink
            className="font-medium text-brand-800 underline"
            href={`/evidence/runs/${revisions[0].id}`}
          >
            Open the current revision
          </IntentLink>
          .
        </p>
      )}
      <div className="grid gap-6 xl:grid-cols-[1fr_22rem]">
        <div className="space-y-6">
          <OutcomePanel
            outcome={{ ...outcome, samples: worked.items }}
            pager={
              <SamplePager page={worked} basePath={runPath} label="Pages of the samples' working" />
            }
          />

          <section aria-labelledby="samples-title" className="space-y-3">
            <h2 id="samples-title" className="text-base font-semibold">
              Raw data ({samples.length} sample{samples.length === 1 ? "" : "s"})
            </h2>
            <SamplePager page={shown} basePath={runPath} label="Pages of raw data" />
            {samples.length > 0 && (
              <ul className="divide-y divide-stone-100 rounded-lg border border-stone-200 bg-white text-sm">
                {shown.items.map((r) => (
                  <li key={r.id} className="flex items-start justify-between gap-3 px-3 py-2">
                    <div>
                      <span className="font-medium">{r.sampleLabel}</span>
                      {r.cycleNumber && (
                        <span className="text-stone-600"> · cycle {r.cycleNumber}</span>
                      )}
                      {r.basketPosition && (
                        <span className="text-stone-600"> · basket {r.basketPosition}</span>
                      )}
                      {r.worstCase && <span className="text-stone-600"> · worst case</span>}
                      <p className="mt-0.5 text-xs text-stone-700 tabular-nums">
                        {describeSample(run.testType, r.data)}
                      </p>
                    </div>
                    {mayRecord && (
                      <RemoveSampleButton
                        action={removeSampleAction}
                        runId={run.id}
                        sampleId={r.id}
                        label={r.sampleLabel}
                      />
                    )}
                  </li>
                ))}
              </ul>
            )}
            {mayRecord &&
              testEntryCautions(run.testType).map((c) => (
                <Caution key={c.kind} title={c.title}>
                  {c.text}
                </Caution>
              ))}
            {mayRecord && (
              <SampleForm action={addSampleAction} runId={run.id} testType={run.testType} />
            )}
            {methodKinds.length > 0 && (
              <>
                <h3 className="pt-2 text-sm font-semibold">Methods used</h3>
                {cited.length > 0 ? (
                  <ul className="text-sm" aria-label="Cited methods">
                    {cited.map((m) => (
                      <li key={m.kind}>
                        {LAB_METHOD_KIND_LABELS[m.kind]}:{" "}
                        <IntentLink
                          href={`/lab/methods/${m.methodId}`}
                          className="text-brand-800 underline"
                        >
                          {m.code} v{m.version}
                        </IntentLink>{" "}
                        {m.name}
                      </li>
                    ))}
                  </ul>
                ) : (
                  <p className="text-sm text-stone-600">No lab method cited.</p>
                )}
                {mayRecord && (
                  <CiteMethodsForm
                    action={citeMethodsAction}
                    runId={run.id}
                    kinds={methodKinds}
                    cited={Object.fromEntries(cited.map((m) => [m.kind, m.methodId]))}
                    options={{
                      extraction: optionsOf(citable, "extraction"),
                      analysis: optionsOf(citable, "analysis"),
                      gravimetric: optionsOf(citable, "gravimetric"),
                    }}
                  />
                )}
              </>
            )}
            {mayRecord && run.testType === "particle_cleanliness" && (
              <>
                <h3 className="pt-2 text-sm font-semibold">
                  Extraction (declining test) and blank value
                </h3>
                <RunDataForm action={saveRunDataAction} runId={run.id} defaults={runData} />
              </>
            )}
            {mayRecord && run.testType === "particle_cleanliness" && (
              <>
                <h3 className="pt-2 text-sm font-semibold">
                  Extraction, analysis and components tested
                </h3>
                <LabDetailsForm
                  key={cited.map((m) => m.methodId).join(",")}
                  fromMethods={labDetailsFromMethods(cited)}
                  action={saveLabDetailsAction}
                  runId={run.id}
                  details={detail.labDetails}
                  fallback={{
                    drawingRevision: family.drawingRevision,
                    wettedAreaCm2: family.wettedAreaCm2,
                    wettedAreaMethod: family.wettedAreaMethod,
                  }}
                  files={files
                    .filter(({ file }) => file.kind === "photo" || file.kind === "membrane_image")
                    .map(({ file }) => ({ id: file.id, name: file.originalName }))}
                  sampleLabels={samples.map((s) => s.sampleLabel)}
                />
              </>
            )}
            {mayRecord && isCsvTestType(run.testType) && (
              <>
                <h3 className="pt-2 text-sm font-semibold">Import samples from a CSV file</h3>
                <CsvImport runId={run.id} testType={run.testType} />
              </>
            )}
          </section>

          <RunInstruments runId={run.id} mayRecord={mayRecord} />

          <section aria-labelledby="files-title" className="space-y-3">
            <h2 id="files-title" className="text-base font-semibold">
              Evidence files
            </h2>
            {files.length === 0 ? (
              <p className="text-sm text-stone-600">No files attached.</p>
            ) : (
              <Table caption="Evidence files">
                <THead>
                  <Th>File</Th>
                  <Th>Kind</Th>
                  <Th align="right">Size</Th>
                  <Th>SHA-256</Th>
                  <Th>Uploaded</Th>
                  {mayRecord && (
                    <Th>
                      <span className="sr-only">Detach</span>
                    </Th>
                  )}
                </THead>
                <TBody>
                  {files.map(({ file, uploader }) => (
                    <tr key={file.id}>
                      <Td>
                        <a
                          href={`/api/evidence/files/${file.id}`}
                          className="font-medium text-brand-800 hover:underline"
                        >
                          {file.originalName}
                        </a>
                      </Td>
                      <Td>
                        {humanize(file.kind)}
                        {file.sampleLabel ? ` · ${file.sampleLabel}` : ""}
                      </Td>
                      <Td numeric>{formatSize(file.sizeBytes)}</Td>
                      <Td className="font-mono text-xs" title={file.sha256}>
                        {file.sha256.slice(0, 12)}…
                      </Td>
                      <Td className="text-xs">
                        {uploader}, {formatDateTime(file.uploadedAt)}
                      </Td>
                      {mayRecord && (
                        <Td>
                          <DetachFileForm
                            action={detachFileAction}
                            runId={run.id}
                            fileId={file.id}
                            name={file.originalName}
                          />
                        </Td>
                      )}
                    </tr>
                  ))}
                </TBody>
              </Table>
            )}
            {mayRecord && <FileUpload runId={run.id} maxMb={env().UPLOAD_MAX_MB} />}
          </section>
        </div>

        <aside className="space-y-6">
          <section
            aria-labelledby="context-title"
            className="rounded-lg border border-stone-200 bg-white p-4 text-sm"
          >
            <h2 id="context-title" className="mb-2 font-semibold">
              Run
            </h2>
            <dl className="grid grid-cols-[max-content_1fr] gap-x-3 gap-y-1">
              <dt className="text-stone-500">Specification</dt>
              <dd>
                {spec.code} <span className="block font-mono text-xs">{spec.ccc}</span>
              </dd>
              <dt className="text-stone-500">Wetted area</dt>
              <dd>
                {detail.labDetails?.component.wettedAreaCm2 ?? family.wettedAreaCm2} cm² per part
              </dd>
              <dt className="text-stone-500">Technician</dt>
              <dd>{detail.technician ?? "—"}</dd>
              <dt className="text-stone-500">Lab</dt>
              <dd>{run.lab ?? "—"}</dd>
              <dt className="text-stone-500">Test date</dt>
              <dd>{run.performedOn ?? "—"}</dd>
              <dt className="text-stone-500">Protocol</dt>
              <dd>{detail.protocol ? detail.protocol.number : "—"}</dd>
              <dt className="text-stone-500">Change request</dt>
              <dd>
                {detail.change
                  ? `${detail.change.number}${run.requirement ? ` · ${run.requirement}` : ""}`
                  : (run.requirement ?? "—")}
              </dd>
              <dt className="text-stone-500">Content hash</dt>
              <dd className="font-mono text-xs break-all">{detail.contentHash}</dd>
            </dl>
            <a
              href={`/api/evidence/runs/${run.id}/report`}
              className="mt-3 inline-block font-medium text-brand-800 hover:underline"
            >
              Download test report (PDF)
            </a>
          </section>

          <section
            aria-labelledby="signatures-title"
            className="space-y-3 rounded-lg border border-stone-200 bg-white p-4"
          >
            <h2 id="signatures-title" className="font-semibold">
              Signatures
            </h2>
            <SignatureList signatures={signatures} />
            {open && run.technicianId === user.id && can(user.roles, "evidence.sign_performed") && (
              <SignatureDialog
                action={signRunAction}
                postsMeaning
                recordType="test_run"
                meaning="performed"
                signerName={user.name}
                recordLabel={label}
                contentHash={detail.contentHash}
                hidden={{ runId: run.id }}
              />
            )}
            {run.status === "performed" &&
              can(user.roles, "evidence.verify") &&
              performedBy?.userId !== user.id && (
                <SignatureDialog
                  action={signRunAction}
                  postsMeaning
                  recordType="test_run"
                  meaning="verified"
                  signerName={user.name}
                  recordLabel={label}
                  contentHash={detail.contentHash}
                  hidden={{ runId: run.id }}
                />
              )}
          </section>

          {(run.status === "performed" || run.status === "verified") &&
            can(user.roles, "evidence.record") && (
              <ReviseForm action={reviseRunAction} runId={run.id} />
            )}

          <section
            aria-labelledby="revisions-title"
            className="rounded-lg border border-stone-200 bg-white p-4 text-sm"
          >
            <h2 id="revisions-title" className="mb-2 font-semibold">
              Revisions
            </h2>
            <ol className="space-y-2">
              {revisions.map((r) => (
                <li key={r.id}>
                  {r.id === run.id ? (
                    <span className="font-medium">Revision {r.revision} (this page)</span>
                  ) : (
                    <IntentLink
                      href={`/evidence/runs/${r.id}`}
                      className="font-medium text-brand-800 hover:underline"
                    >
                      Revision {r.revision}
                    </IntentLink>
                  )}{" "}
                  · <RunStatusWord status={r.status} /> · <OutcomeWord outcome={r.outcome} />
                  {r.revisionReason && (
                    <span className="block text-xs text-stone-600">Reason: {r.revisionReason}</span>
                  )}
                </li>
              ))}
            </ol>
          </section>
        </aside>
      </div>
    </>
  );
}

function optionsOf(
  methods: { id: string; kind: string; code: string; version: number; name: string }[],
  kind: string,
) {
  return methods
    .filter((m) => m.kind === kind)
    .map((m) => ({ value: m.id, label: `${m.code} v${m.version} · ${m.name}` }));
}
