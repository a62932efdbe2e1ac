-- Custom SQL migration file, put your code below! --
-- An adjustment's effect now counts only the readings between it and the adjustments next to it (effectWindows in
-- packages/core). The stored effects were counted the old way; the next refresh measures every adjustment again.
DELETE FROM `report_leveling`;
