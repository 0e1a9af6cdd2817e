/**
 * sin e of a batch of elevations, the argument every mapping and gradient model starts from: computed
 * once per direction here and handed to MappingEvaluator.mapBatch and GradientModel.mapBatch, instead of
 * each model's loop calling Math.sin again (the Niell + Chen & Herring slant path called it twice).
 *
 * @param elevationsRad elevations [rad]
 * @param out sin e [-], out[i] = Math.sin(elevationsRad[i]) bit for bit, same length or longer
 * @returns out
 */
export function elevationSines(elevationsRad: ArrayLike<number>, out: Float64Array): Float64Array {
  for (let i = 0; i < elevationsRad.length; i++) out[i] = Math.sin(elevationsRad[i]!);
  return out;
}
