/**
 * Lossline ingest core (pure): bytes -> text -> layout profile -> samples -> tag hours.
 *
 *   const decoder = createDecoder();
 *   const text = decoder.push(firstChunk) ...            // first 64 KiB decide the encoding
 *   const profile = sniffLayout(sampleText, { complete }); // answer profile.questions if any
 *   const agg = createHourAggregator({ timeZone, tagOptions, onHour });
 *   const reader = createRowReader(profile, { timeZone, sink: agg });
 *   for each chunk: reader.push(decoder.push(chunk));
 *   reader.push(decoder.end()); const report = reader.end(); agg.flush();
 */
export * from './errors';
export * from './decode';
export * from './csv';
export * from './numbers';
export * from './time';
export * from './profile';
export * from './fingerprint';
export * from './quality';
export * from './sniff';
export * from './reader';
export * from './aggregate';
export * from './merge';
export * from './pipeline';
export * from './limits';
export * from './layout-check';
export * from './column-numbers';
export * from './verdict';
export * from './quality-codes';
export * from './quality-columns';
