// Synthetic photos with known answers: the demo reference card and yarn swatches through a model camera.
export { DEMO_CARD } from "./card";
export type { CardPatchSpec, ReferenceCardSpec } from "./card";
export { DEFAULT_CAMERA, makeCamera } from "./camera";
export type { SyntheticCamera, SyntheticCameraSpec } from "./camera";
export { defaultGridCorners, renderPhoto } from "./photo";
export type { PhotoOptions, SyntheticPhoto } from "./photo";
export { hash2, seededRandom } from "./random";
export type { Random } from "./random";
export { DEFAULT_TEXTURE, renderYarn } from "./yarn";
export type { YarnSpec, YarnTexture, YarnTruth } from "./yarn";
