-- Trigram matching for the inventory search (ILIKE %…%), used by the indexes of the next migration.
CREATE EXTENSION IF NOT EXISTS pg_trgm;
