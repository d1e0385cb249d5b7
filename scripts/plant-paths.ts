/** A plant's own data, kept apart from the demo's data/washproof.db so the two never mix. */
export const PLANT_DATABASE_FILE = "data/plant.db";
export const PLANT_UPLOAD_DIR = "data/plant-uploads";
