/**
 * Demo workpapers, one per method, for tests and previews. Invented firm, client and ledgers; every
 * size, selection and evaluation figure comes from the engine (lib/sampling), none is typed in.
 */
export { attributesFixture } from "./fixtures/attributes-fixture";
export { musFixture } from "./fixtures/mus-fixture";
export { stratifiedFixture } from "./fixtures/stratified-fixture";
export { variablesFixture } from "./fixtures/variables-fixture";
