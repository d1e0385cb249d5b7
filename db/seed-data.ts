import type { ParameterKind, Role } from "./enums";

/**
 * The demo scenario: an invented supplier of hydraulic and fuel-system parts,
 * Fennmoor Fluidtech, with one plant. Every company, person and product here is
 * made up for the demo.
 */
export const DEMO_PASSWORD = "Washproof-demo-2026";

export const DEMO_USERS: { name: string; email: string; jobTitle: string; roles: Role[] }[] = [
  {
    name: "Priya Castell",
    email: "admin@fennmoor.example",
    jobTitle: "Quality systems administrator",
    roles: ["admin"],
  },
  {
    name: "Ines Varga",
    email: "engineer@fennmoor.example",
    jobTitle: "Process quality engineer",
    roles: ["engineer"],
  },
  {
    name: "Tomas Brandt",
    email: "reviewer@fennmoor.example",
    jobTitle: "Production engineering lead",
    roles: ["reviewer"],
  },
  {
    name: "Helena Okafor",
    email: "approver@fennmoor.example",
    jobTitle: "Quality manager",
    roles: ["approver"],
  },
  {
    name: "Ravi Menon",
    email: "technician@fennmoor.example",
    jobTitle: "Cleanliness lab technician",
    roles: ["technician"],
  },
  {
    name: "Margit Olsen",
    email: "auditor@fennmoor.example",
    jobTitle: "Customer quality auditor",
    roles: ["auditor"],
  },
];

export const DEMO_COMPANY = "Fennmoor Fluidtech";

export const DEMO_SITE = { name: "Fennmoor Fluidtech — Larchfield plant", location: "Larchfield" };

/** Equipment figures are invented but plausible (about 10 W/L of ultrasonics, 3–15 bar pumps) [practice]. */
export const DEMO_SYSTEMS = [
  {
    code: "AW-3",
    name: "Three-tank aqueous washer",
    kind: "multi_tank_aqueous" as const,
    description:
      "Alkaline ultrasonic wash with spray, flood and bore injection; tap-water rinse; deionised final rinse; hot-air and vacuum drying.",
    stages: [
      {
        name: "Tank 1 — alkaline wash",
        kind: "wash" as const,
        capabilities: ["ultrasonic", "spray", "flood", "injection"],
        tankVolumeL: 900,
        filterRatingUm: 25,
        ultrasonicPowerW: 9000,
        ultrasonicFrequencyKHz: 40,
        sprayPressureBar: 4,
        injectionPressureBar: 15,
        nozzleSet: "NS-AW3-1A",
      },
      {
        name: "Tank 2 — rinse",
        kind: "rinse" as const,
        capabilities: ["spray", "flood"],
        tankVolumeL: 800,
        filterRatingUm: 50,
        sprayPressureBar: 4,
        nozzleSet: "NS-AW3-2A",
      },
      {
        name: "Tank 3 — deionised final rinse",
        kind: "final_rinse" as const,
        capabilities: ["spray", "flood"],
        tankVolumeL: 800,
        filterRatingUm: 10,
        sprayPressureBar: 3,
        nozzleSet: "NS-AW3-3A",
      },
      {
        name: "Dryer",
        kind: "drying" as const,
        capabilities: ["hot_air_drying", "vacuum_drying"],
        tankVolumeL: null,
      },
    ],
  },
  {
    code: "SC-1",
    name: "Single-chamber spray washer",
    kind: "single_chamber_spray" as const,
    description: "One chamber: wash, rinse and hot-air drying in sequence, fed from two tanks.",
    stages: [
      {
        name: "Spray wash",
        kind: "wash" as const,
        capabilities: ["spray"],
        tankVolumeL: 400,
        filterRatingUm: 50,
        sprayPressureBar: 5,
        nozzleSet: "NS-SC1-W",
      },
      {
        name: "Spray rinse",
        kind: "rinse" as const,
        capabilities: ["spray"],
        tankVolumeL: 400,
        filterRatingUm: 50,
        sprayPressureBar: 5,
        nozzleSet: "NS-SC1-W",
      },
      {
        name: "Hot-air drying",
        kind: "drying" as const,
        capabilities: ["hot_air_drying"],
        tankVolumeL: null,
      },
    ],
  },
];

export const DEMO_SPECS = [
  {
    code: "CS-VB-01",
    name: "Valve body, fuel-system grade",
    customer: "Harrowgate Injection Systems",
    documentNumber: "HIS-TC-0412",
    revision: "C",
    extraRequirements: "Report per VDA 19.1 with membrane images of the three largest particles.",
    customerApprovesChanges: true,
    ccc: "A(B-D18/E15/F13/G11/H9/I-J3/K-N00)",
    maxMetallicUm: 400,
    maxNonMetallicUm: 600,
    maxFibreUm: 1000,
    gravimetricLimitMg: 2.0,
    gravimetricBasis: "per_component" as const,
    minWettingTensionMNm: 38,
    visualCriteria: "No water stains, no visible residue under 2× magnification",
    drynessCriteria: "No standing water in bores after 5 min at ambient",
  },
  {
    code: "CS-PH-02",
    name: "Pump housing, hydraulic grade",
    customer: "Brackenfold Hydraulics",
    documentNumber: "BH-QS-77",
    revision: "2",
    extraRequirements: null,
    customerApprovesChanges: false,
    ccc: "A(C-E17/F-G14/H-I6/J2/K-N00)",
    maxMetallicUm: 600,
    maxNonMetallicUm: 1000,
    maxFibreUm: 2000,
    gravimetricLimitMg: 5.0,
    gravimetricBasis: "per_component" as const,
    minWettingTensionMNm: null,
    visualCriteria: "No rust bloom, no water stains",
    drynessCriteria: "Dry to touch; no water in cored passages",
  },
  {
    code: "CS-SF-03",
    name: "Small fitting, per-component limits",
    customer: "Brackenfold Hydraulics",
    documentNumber: "BH-QS-81",
    revision: "1",
    extraRequirements: null,
    customerApprovesChanges: false,
    ccc: "N(C-E2000/F-G120/H-I8/J-N0)",
    maxMetallicUm: 400,
    maxNonMetallicUm: 600,
    maxFibreUm: 1000,
    gravimetricLimitMg: 0.5,
    gravimetricBasis: "per_component" as const,
    minWettingTensionMNm: 36,
    visualCriteria: "No stains or discolouration",
    drynessCriteria: "Dry to touch",
  },
];

export const DEMO_PART_FAMILIES = [
  {
    code: "PF-VB-210",
    name: "Valve body VB-210",
    partNumbers: ["VB-210-01", "VB-210-02"],
    material: "Aluminium EN AC-46000, machined",
    wettedAreaCm2: 420,
    wettedAreaMethod: "cad_model" as const,
    wettedVolumeCm3: 35,
    drawingNumber: "D-VB-210",
    drawingRevision: "F",
    customer: "Harrowgate Injection Systems",
    spec: "CS-VB-01",
  },
  {
    code: "PF-PH-400",
    name: "Pump housing PH-400",
    partNumbers: ["PH-400-11"],
    material: "Grey cast iron EN-GJL-250",
    wettedAreaCm2: 1850,
    wettedAreaMethod: "cad_model" as const,
    wettedVolumeCm3: 260,
    drawingNumber: "D-PH-400",
    drawingRevision: "C",
    customer: "Brackenfold Hydraulics",
    spec: "CS-PH-02",
  },
  {
    code: "PF-SF-12",
    name: "Straight fitting SF-12",
    partNumbers: ["SF-12-M12", "SF-12-M14"],
    material: "Stainless steel 1.4305",
    wettedAreaCm2: 38,
    wettedAreaMethod: "calculated" as const,
    wettedVolumeCm3: 2.5,
    drawingNumber: "D-SF-12",
    drawingRevision: "B",
    customer: "Brackenfold Hydraulics",
    spec: "CS-SF-03",
  },
];

type P = {
  key: string;
  name: string;
  kind: ParameterKind;
  setpoint: number;
  unit: string;
  low: number | null;
  high: number | null;
  critical?: boolean;
};
type S = {
  name: string;
  kind: "wash" | "rinse" | "final_rinse" | "drying" | "other";
  mode: string | null;
  parameters: P[];
};
export type DemoRecipeVersion = {
  detergent: string | null;
  notes: string;
  effectiveFrom: string;
  stages: S[];
};

const valveBodyV1: DemoRecipeVersion = {
  detergent: "Alkaline cleaner AC-14 (mildly alkaline, silicate-free)",
  notes: "Settings from the commissioning trials.",
  effectiveFrom: "2025-03-10T07:00:00.000Z",
  stages: [
    {
      name: "Wash",
      kind: "wash",
      mode: "ultrasonic",
      parameters: [
        {
          key: "wash.temperature",
          name: "Bath temperature",
          kind: "temperature",
          setpoint: 55,
          unit: "°C",
          low: 50,
          high: 65,
          critical: true,
        },
        {
          key: "wash.time",
          name: "Wash time",
          kind: "time",
          setpoint: 240,
          unit: "s",
          low: 180,
          high: 300,
          critical: true,
        },
        {
          key: "wash.concentration",
          name: "Detergent concentration",
          kind: "concentration",
          setpoint: 3,
          unit: "%",
          low: 2,
          high: 4,
          critical: true,
        },
        {
          key: "wash.ultrasonic_power",
          name: "Ultrasonic power density",
          kind: "ultrasonic_power",
          setpoint: 10,
          unit: "W/L",
          low: 8,
          high: 12,
        },
        {
          key: "wash.ultrasonic_frequency",
          name: "Ultrasonic frequency",
          kind: "ultrasonic_frequency",
          setpoint: 40,
          unit: "kHz",
          low: 40,
          high: 40,
        },
      ],
    },
    {
      name: "Rinse",
      kind: "rinse",
      mode: "spray",
      parameters: [
        {
          key: "rinse.temperature",
          name: "Rinse temperature",
          kind: "temperature",
          setpoint: 45,
          unit: "°C",
          low: 35,
          high: 55,
        },
        {
          key: "rinse.time",
          name: "Rinse time",
          kind: "time",
          setpoint: 90,
          unit: "s",
          low: 60,
          high: 120,
        },
        {
          key: "rinse.spray_pressure",
          name: "Spray pressure",
          kind: "spray_pressure",
          setpoint: 3,
          unit: "bar",
          low: 2,
          high: 4,
        },
      ],
    },
    {
      name: "Final rinse (deionised)",
      kind: "final_rinse",
      mode: "spray",
      parameters: [
        {
          key: "final_rinse.conductivity_limit",
          name: "Rinse-water conductivity limit",
          kind: "conductivity_limit",
          setpoint: 10,
          unit: "µS/cm",
          low: 0,
          high: 20,
          critical: true,
        },
        {
          key: "final_rinse.time",
          name: "Final rinse time",
          kind: "time",
          setpoint: 60,
          unit: "s",
          low: 45,
          high: 90,
        },
      ],
    },
    {
      name: "Drying",
      kind: "drying",
      mode: "vacuum_drying",
      parameters: [
        {
          key: "drying.temperature",
          name: "Drying temperature",
          kind: "drying_temperature",
          setpoint: 110,
          unit: "°C",
          low: 100,
          high: 120,
          critical: true,
        },
        {
          key: "drying.time",
          name: "Drying time",
          kind: "time",
          setpoint: 300,
          unit: "s",
          low: 240,
          high: 420,
        },
        {
          key: "drying.vacuum",
          name: "Vacuum end pressure",
          kind: "vacuum_pressure",
          setpoint: 20,
          unit: "mbar",
          low: 10,
          high: 50,
        },
      ],
    },
    {
      name: "Loading and filtration",
      kind: "other",
      mode: null,
      parameters: [
        {
          key: "loading.parts_per_basket",
          name: "Parts per basket",
          kind: "basket_loading",
          setpoint: 24,
          unit: "parts/basket",
          low: 12,
          high: 24,
          critical: true,
        },
        {
          key: "filtration.change_interval",
          name: "Bag filter change interval",
          kind: "filter_interval",
          setpoint: 160,
          unit: "h",
          low: null,
          high: 200,
        },
      ],
    },
  ],
};

/** Version 2 moved the wash temperature up inside its validated range. */
const valveBodyV2: DemoRecipeVersion = {
  ...valveBodyV1,
  notes: "Wash temperature raised from 55 °C to 60 °C inside the validated range.",
  effectiveFrom: "2025-09-01T07:00:00.000Z",
  stages: valveBodyV1.stages.map((s) => ({
    ...s,
    parameters: s.parameters.map((p) =>
      p.key === "wash.temperature" ? { ...p, setpoint: 60 } : p,
    ),
  })),
};

export const DEMO_RECIPES: {
  system: string;
  code: string;
  name: string;
  description: string;
  versions: DemoRecipeVersion[];
}[] = [
  {
    system: "AW-3",
    code: "R-AW3-VB",
    name: "Valve body, ultrasonic",
    description: "For PF-VB-210 in baskets of 24.",
    versions: [valveBodyV1, valveBodyV2],
  },
  {
    system: "AW-3",
    code: "R-AW3-PH",
    name: "Pump housing, flood and injection",
    description: "For PF-PH-400; bores injected, housings on fixtures.",
    versions: [
      {
        detergent: "Alkaline cleaner AC-14 (mildly alkaline, silicate-free)",
        notes: "Settings from the commissioning trials.",
        effectiveFrom: "2025-05-20T07:00:00.000Z",
        stages: [
          {
            name: "Wash",
            kind: "wash",
            mode: "injection",
            parameters: [
              {
                key: "wash.temperature",
                name: "Bath temperature",
                kind: "temperature",
                setpoint: 65,
                unit: "°C",
                low: 60,
                high: 70,
                critical: true,
              },
              {
                key: "wash.time",
                name: "Wash time",
                kind: "time",
                setpoint: 360,
                unit: "s",
                low: 300,
                high: 420,
                critical: true,
              },
              {
                key: "wash.concentration",
                name: "Detergent concentration",
                kind: "concentration",
                setpoint: 4,
                unit: "%",
                low: 3,
                high: 5,
                critical: true,
              },
              {
                key: "wash.injection_pressure",
                name: "Injection pressure",
                kind: "spray_pressure",
                setpoint: 12,
                unit: "bar",
                low: 10,
                high: 15,
                critical: true,
              },
            ],
          },
          {
            name: "Rinse",
            kind: "rinse",
            mode: "flood",
            parameters: [
              {
                key: "rinse.time",
                name: "Rinse time",
                kind: "time",
                setpoint: 120,
                unit: "s",
                low: 90,
                high: 150,
              },
            ],
          },
          {
            name: "Final rinse (deionised)",
            kind: "final_rinse",
            mode: "flood",
            parameters: [
              {
                key: "final_rinse.conductivity_limit",
                name: "Rinse-water conductivity limit",
                kind: "conductivity_limit",
                setpoint: 20,
                unit: "µS/cm",
                low: 0,
                high: 30,
                critical: true,
              },
            ],
          },
          {
            name: "Drying",
            kind: "drying",
            mode: "hot_air_drying",
            parameters: [
              {
                key: "drying.temperature",
                name: "Drying temperature",
                kind: "drying_temperature",
                setpoint: 120,
                unit: "°C",
                low: 110,
                high: 130,
                critical: true,
              },
              {
                key: "drying.time",
                name: "Drying time",
                kind: "time",
                setpoint: 600,
                unit: "s",
                low: 480,
                high: 720,
              },
            ],
          },
        ],
      },
    ],
  },
  {
    system: "SC-1",
    code: "R-SC1-SF",
    name: "Fitting, spray",
    description: "For PF-SF-12 in mesh baskets of 200.",
    versions: [
      {
        detergent: "Neutral cleaner NC-7",
        notes: "Settings from the commissioning trials.",
        effectiveFrom: "2025-06-02T07:00:00.000Z",
        stages: [
          {
            name: "Spray wash",
            kind: "wash",
            mode: "spray",
            parameters: [
              {
                key: "wash.temperature",
                name: "Wash temperature",
                kind: "temperature",
                setpoint: 55,
                unit: "°C",
                low: 50,
                high: 60,
                critical: true,
              },
              {
                key: "wash.time",
                name: "Wash time",
                kind: "time",
                setpoint: 180,
                unit: "s",
                low: 150,
                high: 240,
                critical: true,
              },
              {
                key: "wash.concentration",
                name: "Detergent concentration",
                kind: "concentration",
                setpoint: 2,
                unit: "%",
                low: 1.5,
                high: 3,
                critical: true,
              },
              {
                key: "wash.spray_pressure",
                name: "Spray pressure",
                kind: "spray_pressure",
                setpoint: 4,
                unit: "bar",
                low: 3,
                high: 5,
              },
            ],
          },
          {
            name: "Spray rinse",
            kind: "rinse",
            mode: "spray",
            parameters: [
              {
                key: "rinse.time",
                name: "Rinse time",
                kind: "time",
                setpoint: 90,
                unit: "s",
                low: 60,
                high: 120,
              },
            ],
          },
          {
            name: "Hot-air drying",
            kind: "drying",
            mode: "hot_air_drying",
            parameters: [
              {
                key: "drying.temperature",
                name: "Drying temperature",
                kind: "drying_temperature",
                setpoint: 90,
                unit: "°C",
                low: 80,
                high: 100,
                critical: true,
              },
              {
                key: "drying.time",
                name: "Drying time",
                kind: "time",
                setpoint: 420,
                unit: "s",
                low: 360,
                high: 540,
              },
            ],
          },
          {
            name: "Loading",
            kind: "other",
            mode: null,
            parameters: [
              {
                key: "loading.parts_per_basket",
                name: "Parts per basket",
                kind: "basket_loading",
                setpoint: 200,
                unit: "parts/basket",
                low: 100,
                high: 200,
                critical: true,
              },
            ],
          },
        ],
      },
    ],
  },
];
