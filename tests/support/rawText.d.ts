// Vite's `?raw` imports give a fixture file's text (used for the NIST StRD .dat files).
declare module '*.dat?raw' {
  const text: string;
  export default text;
}
