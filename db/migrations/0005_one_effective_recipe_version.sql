-- One effective version per recipe at a time: closing a change supersedes the old version and makes the new one effective in one transaction.
CREATE UNIQUE INDEX `recipe_versions_one_effective_uq` ON `recipe_versions` (`recipe_id`) WHERE `status` = 'effective';
