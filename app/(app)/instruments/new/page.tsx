import type { Metadata } from "next";
import { NewInstrumentForm } from "@/components/instruments/instrument-forms";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";

export const metadata: Metadata = { title: "Register an instrument" };

export default async function NewInstrumentPage() {
  await requirePageUser("instrument.manage");
  return (
    <>
      <PageHeader
        title="Register an instrument"
        description="A balance, an analysis system, a meter, a thermometer or gauge is calibrated on an interval; a test-ink set is used until its expiry date."
      />
      <NewInstrumentForm />
    </>
  );
}
