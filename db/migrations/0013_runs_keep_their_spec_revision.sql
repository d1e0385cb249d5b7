-- Runs opened before specifications had revisions were judged by their part family's one
-- specification: record it on each run so a later revision never re-judges them.
UPDATE `test_runs` SET `spec_id` = (SELECT `spec_id` FROM `part_families` WHERE `part_families`.`id` = `test_runs`.`part_family_id`) WHERE `spec_id` IS NULL;
