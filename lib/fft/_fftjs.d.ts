declare const FFT: unknown;
export default FFT;
