import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { z } from "zod";
import { FamilyPicture } from "@/components/parts/family-picture";
import { PartFamilyForm } from "@/components/parts/part-family-form";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/permissions";
import { withUnit } from "@/lib/format/number";
import { requirePageUser } from "@/lib/server/auth/current-user";
import {
  familyInUse,
  familyPictureVersion,
  getPartFamily,
  specsInForce,
} from "@/lib/server/plant/parts-queries";
import { NcPanel } from "@/components/nonconformances/nc-panel";
import { ControlPlanLinks } from "@/components/control-plans/control-plan-links";
import { controlPlansOf } from "@/lib/server/control-plans/queries";
import { updatePartFamilyAction } from "../../actions";
import { recordTitle } from "@/lib/server/page-titles";

export async function generateMetadata({
  params,
}: {
  params: Promise<{ familyId: string }>;
}): Promise<Metadata> {
  return recordTitle("partFamily", (await params).familyId, "Part family");
}

export default async function PartFamilyPage({
  params,
}: {
  params: Promise<{ familyId: string }>;
}) {
  const user = await requirePageUser("parts.view");
  const id = z.uuid().safeParse((await params).familyId);
  if (!id.success) notFound();
  const family = await getPartFamily(id.data);
  if (!family) notFound();
  const manage = can(user.roles, "parts.manage");
  const [specs, inUse, picture, plans] = await Promise.all([
    specsInForce(),
    familyInUse(family.id),
    familyPictureVersion(family.id),
    controlPlansOf({ partFamilyId: family.id }),
  ]);
  return (
    <>
      <PageHeader
        title={`${family.code} · ${family.name}`}
        description={`${family.material}; ${withUnit(family.wettedAreaCm2, "cm²")} wetted area per part.${inUse ? " In use: runs or qualified recipes refer to it." : ""}`}
      />
      <FamilyPicture
        familyId={family.id}
        familyName={family.name}
        version={picture}
        canUpload={manage}
      />
      {manage ? (
        <PartFamilyForm
          action={updatePartFamilyAction}
          values={family}
          specs={specs}
          inUse={inUse}
        />
      ) : (
        <p className="text-sm text-stone-600">
          Only engineers and administrators edit part families.
        </p>
      )}
      <ControlPlanLinks
        plans={plans}
        none="No control plan for this part family yet: one per qualified recipe version."
      />
      <NcPanel roles={user.roles} where={{ partFamilyId: family.id }} />
    </>
  );
}
