import type { TestType } from "@/db/enums";

export interface TestCaution {
  kind: "hot_parts" | "extraction_liquid" | "uv_a";
  title: string;
  text: string;
}

/** Parts are sampled at the washer's exit; hot-air dryers run up to about 130 °C [practice]. */
const HOT_PARTS: TestCaution = {
  kind: "hot_parts",
  title: "hot parts",
  text: "Parts taken straight from the dryer can be hot enough (up to about 130 °C) to give a dry-heat burn. Let them cool, or handle them with heat-resistant gloves, before testing.",
};

const EXTRACTION_LIQUID: TestCaution = {
  kind: "extraction_liquid",
  title: "extraction liquids",
  text: "Extraction liquids (cleaners, solvents) irritate skin and eyes, and solvents are often flammable and give off vapour. Work with extraction and ventilation, wear gloves and eye protection, keep ignition sources away, and follow the liquid's safety data sheet.",
};

const UV_A: TestCaution = {
  kind: "uv_a",
  title: "UV-A lamp",
  text: "UV-A light harms the eyes and skin on long exposure. Never look into the lamp, wear UV-blocking glasses and cover exposed skin while inspecting.",
};

/** The cautions for the person entering results of a test of this type [practice]. */
export function testEntryCautions(testType: TestType): TestCaution[] {
  const out = [HOT_PARTS];
  if (testType === "particle_cleanliness" || testType === "gravimetric")
    out.push(EXTRACTION_LIQUID);
  if (testType === "uv_inspection") out.push(UV_A);
  return out;
}
