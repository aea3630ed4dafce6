/**
 * Synthetic focus stacks for the demo and for tests: a 3-D scene of our own rendered at a
 * series of focus depths, written as camera-like files with capture metadata.
 */
export {
  focusDepthsFor,
  frameFileName,
  renderStack,
  type RenderedFile,
  type RenderedStack,
  type StackTruth,
} from './stack-renderer/render-stack';
export { renderCard, cardOptionsSchema, type CardOptions, type CardStackTruth, type RenderedCard } from './stack-renderer/card';
export { renderStackOptionsSchema, type RenderStackOptions, type StackFaults } from './stack-renderer/options';
export { sceneKinds, type SceneKind } from './stack-renderer/scene';
