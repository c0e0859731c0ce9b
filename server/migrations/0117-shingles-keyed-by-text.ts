import type { Migration } from '../db/migrate';

/**
 * The shingle dictionary loses its surrogate id: nothing refers to it (sets store ranks), yet every
 * new shingle paid for a sequence value and a third index. The text becomes the primary key (it was
 * already unique); rank stays unique. Inserting the 97k new shingles of a tree of published
 * packages took about two thirds of the time in SQL (464 → 317 ms).
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query(`
    alter table shingles drop column id;
    alter table shingles drop constraint shingles_text_key;
    alter table shingles add constraint shingles_pkey primary key (text);
  `);
};

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query(`
    alter table shingles drop constraint shingles_pkey;
    alter table shingles add constraint shingles_text_key unique (text);
    alter table shingles add column id serial primary key;
  `);
};
