// AudioWorklet of the browser recorder (src/features/recording): copies every input channel,
// unmixed (the node is created with channelInterpretation 'discrete'), into blocks of 4096 frames
// and posts each block's channels to the page, transferring the buffers. It outputs nothing.
const BLOCK = 4096;

class CrankwiseRecorder extends AudioWorkletProcessor {
  constructor() {
    super();
    this.channels = null;
    this.filled = 0;
  }

  process(inputs) {
    const input = inputs[0];
    if (!input || input.length === 0) return true;
    if (!this.channels || this.channels.length !== input.length) {
      this.channels = input.map(() => new Float32Array(BLOCK));
      this.filled = 0;
    }
    const n = input[0].length;
    let offset = 0;
    while (offset < n) {
      const take = Math.min(n - offset, BLOCK - this.filled);
      for (let c = 0; c < input.length; c++) this.channels[c].set(input[c].subarray(offset, offset + take), this.filled);
      this.filled += take;
      offset += take;
      if (this.filled === BLOCK) {
        const out = this.channels;
        this.port.postMessage(out, out.map((c) => c.buffer));
        this.channels = input.map(() => new Float32Array(BLOCK));
        this.filled = 0;
      }
    }
    return true;
  }
}

registerProcessor('crankwise-recorder', CrankwiseRecorder);
