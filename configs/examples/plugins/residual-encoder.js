// A plugin encoder for Midpath: a residual MLP, ψ(x) = W_out (h + f(h)), h = tanh(x W_in).
//
// Contract (docs/training.md, "Plugin encoders"): export `createEncoder(context)` returning
// { variables, apply(x), dispose?() }. `context` holds
//   tf          — Midpath's TF.js module (use it; do not import another copy)
//   inputDim    — observation dimension
//   outputDim   — representation dimension d (apply must return [batch, d])
//   imageShape  — [height, width] for image datasets, else undefined
//   options     — `encoder.options` from the experiment file, untouched
//   seed        — seed for your initialisation (derived from the job's seed)
export function createEncoder({ tf, inputDim, outputDim, options, seed }) {
  const hidden = Number(options.hidden ?? 64);
  const init = (rows, cols, salt) =>
    tf.variable(tf.randomNormal([rows, cols], 0, Math.sqrt(1 / rows), 'float32', seed + salt));
  const wIn = init(inputDim, hidden, 1);
  const wMid = init(hidden, hidden, 2);
  const wOut = init(hidden, outputDim, 3);
  const bOut = tf.variable(tf.zeros([outputDim]));
  return {
    variables: [wIn, wMid, wOut, bOut],
    apply(x) {
      const h = tf.tanh(tf.matMul(x, wIn));
      const residual = tf.add(h, tf.relu(tf.matMul(h, wMid)));
      return tf.add(tf.matMul(residual, wOut), bOut);
    },
  };
}
