// The `zipcodes` package ships no types; only what src/engine/site-position.ts uses.
declare module "zipcodes" {
  type ZipCode = { zip: string; latitude: number; longitude: number; city: string; state: string; country: string };
  const zipcodes: { lookup(zip: string | number): ZipCode | undefined };
  export default zipcodes;
}
