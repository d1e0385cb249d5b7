"use client";

import { useState } from "react";
import { successRunSampleSize } from "@/lib/stats";
import { attempt, CalcError, CalcPanel, errorFor, generalError, requiredInput } from "./calc-kit";
import { NumberField } from "@/components/ui/field";

/** Attribute sample size: a thin wrapper over successRunSampleSize. */
export function SampleSizeCalculator() {
  const [confidence, setConfidence] = useState("0.95");
  const [reliability, setReliability] = useState("0.90");
  const [failures, setFailures] = useState("0");

  const c = requiredInput(confidence);
  const r = requiredInput(reliability);
  const f = requiredInput(failures);
  const outcome = attempt(() => successRunSampleSize(c, r, f));

  return (
    <CalcPanel
      title="Calculator: sample size for pass/fail tests"
      form={
        <>
          <NumberField
            label="Confidence C (fraction; 0.95 = 95 %)"
            value={confidence}
            onValueChange={setConfidence}
            error={errorFor(outcome, "confidence")}
          />
          <NumberField
            label="Reliability R (fraction; 0.90 = 90 %)"
            value={reliability}
            onValueChange={setReliability}
            error={errorFor(outcome, "reliability")}
          />
          <NumberField
            label="Failures allowed"
            unit="parts"
            value={failures}
            onValueChange={setFailures}
            error={errorFor(outcome, "failures")}
          />
        </>
      }
      result={
        <>
          <CalcError message={generalError(outcome, ["confidence", "reliability", "failures"])} />
          {outcome.ok && (
            <>
              <p className="text-sm text-stone-700">Parts to test</p>
              <p className="font-mono text-2xl text-brand-900">n = {outcome.value} parts</p>
              {f === 0 ? (
                <p className="font-mono text-sm text-stone-700">
                  n = ⌈ln(1 − {c}) / ln({r})⌉ = ⌈{(Math.log(1 - c) / Math.log(r)).toFixed(2)}⌉ ={" "}
                  {outcome.value}
                </p>
              ) : (
                <p className="text-sm text-stone-700">
                  The smallest n for which the probability of at most {f} failing part
                  {f === 1 ? "" : "s"}, each failing with probability 1 − R = {(1 - r).toFixed(4)},
                  is at most 1 − C = {(1 - c).toFixed(4)}.
                </p>
              )}
              <p className="text-sm text-stone-700">
                Test {outcome.value} parts; if {f === 0 ? "none fails" : `no more than ${f} fail`},
                the test shows a reliability of at least {(r * 100).toFixed(1)} % with{" "}
                {(c * 100).toFixed(1)} % confidence.
              </p>
            </>
          )}
        </>
      }
    />
  );
}
