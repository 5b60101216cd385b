/**
 * Demo workpapers, one per method, for tests and previews. Invented firm, client and ledgers; every
 * size, selection and evaluation figure comes from the engine (lib/sampling), none is typed in.
 */
export { attributesFixture } from "./attributes-fixture";
export { musFixture } from "./mus-fixture";
export { stratifiedFixture } from "./stratified-fixture";
export { variablesFixture } from "./variables-fixture";
