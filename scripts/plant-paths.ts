/** A plant's own data, kept apart from the demo's data/washproof.db so the two never mix. */
export const PLANT_DATABASE_FILE = "data/plant.db";
export const PLANT_UPLOAD_DIR = "data/plant-uploads";
/** The audit checkpoint key `npm run start:empty` generates when none is configured (a first try, not real records). */
export const PLANT_SIGNING_KEY_FILE = "data/plant-audit-signing-key.pem";
