// Loads reflect-metadata before TypeORM entities are imported in any test file.
import 'reflect-metadata';
