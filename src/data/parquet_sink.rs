//! The Parquet side of [`ColumnWriter`](super::ColumnWriter): float64 columns, one row group per
//! appended block, written straight through polars' Parquet encoder (polars-parquet).
//!
//! polars' own `ParquetWriter` asks for dictionary encoding of every numeric column and then
//! estimates each column's cardinality to decide whether to fall back to plain (about 0.15 CPU
//! seconds of the 10 M-row benchmark, for a decision that always comes out "plain" for measured
//! floats, where nearly every value is distinct). It also copies every block into a DataFrame
//! first. Here a column is encoded plain (Apache Parquet format, Encodings.md: PLAIN, little-
//! endian IEEE 754 doubles) from the caller's own buffer, without a copy. The file is otherwise
//! what `ParquetWriter` writes: format version 1 pages, Snappy compression (pyarrow's default
//! too), min/max and null-count statistics, and the Arrow schema in the footer, so polars,
//! pyarrow and pandas read it as before.

use std::fs::File;
use std::io::BufWriter;
use std::sync::Arc;

use polars::prelude::{PlSmallStr, PolarsError, PolarsResult};
use polars_arrow::array::{Array, PrimitiveArray};
use polars_arrow::datatypes::{ArrowDataType, ArrowSchema, Field};
use polars_buffer::Buffer;
use polars_parquet::parquet::error::ParquetError;
use polars_parquet::write::{
    CompressionOptions, Compressor, DynIter, DynStreamingIterator, Encoding,
    FallibleStreamingIterator, FileWriter, ParquetType, StatisticsOptions, Version, WriteOptions,
    array_to_columns, to_parquet_schema,
};

/// A block's column shared with the caller: the encoder reads it in place.
struct Shared(Arc<Vec<f64>>);

impl AsRef<[f64]> for Shared {
    fn as_ref(&self) -> &[f64] {
        self.0.as_slice()
    }
}

/// An open Parquet file of float64 columns.
pub(super) struct ParquetSink {
    writer: FileWriter<BufWriter<File>>,
    types: Vec<ParquetType>,
    options: WriteOptions,
}

impl ParquetSink {
    /// Starts a file of nullable float64 columns `names` (nullable as polars and pyarrow write
    /// them; no value is ever null here).
    pub(super) fn create(out: BufWriter<File>, names: &[&str]) -> PolarsResult<ParquetSink> {
        let schema: ArrowSchema = names
            .iter()
            .map(|n| {
                let name = PlSmallStr::from(*n);
                (name.clone(), Field::new(name, ArrowDataType::Float64, true))
            })
            .collect();
        let types = to_parquet_schema(&schema)?.fields().to_vec();
        let options = WriteOptions {
            statistics: StatisticsOptions::default(),
            version: Version::V1,
            compression: CompressionOptions::Snappy,
            data_page_size: None,
        };
        Ok(ParquetSink {
            writer: FileWriter::try_new(out, schema, options)?,
            types,
            options,
        })
    }

    /// Writes one row group of `rows` rows, one buffer per column (all of `rows` values).
    pub(super) fn write(&mut self, rows: usize, columns: &[Arc<Vec<f64>>]) -> PolarsResult<()> {
        // An empty block adds no row group (as polars' own writer skips empty batches): the file
        // of an empty log is its schema and no groups.
        if rows == 0 {
            return Ok(());
        }
        let options = self.options;
        let mut encoded = Vec::with_capacity(columns.len());
        for (values, ty) in columns.iter().zip(&self.types) {
            let array = PrimitiveArray::<f64>::new(
                ArrowDataType::Float64,
                Buffer::from_owner(Shared(Arc::clone(values))),
                None,
            );
            let array: Box<dyn Array> = array.boxed();
            for pages in array_to_columns(&array, ty.clone(), options, &[Encoding::Plain])? {
                let pages = pages.map(|p| p.map_err(ParquetError::from));
                let compressed = Compressor::new(pages, options.compression, Vec::new())
                    .map_err(PolarsError::from);
                encoded.push(Ok(DynStreamingIterator::new(compressed)));
            }
        }
        self.writer
            .write(rows as u64, DynIter::new(encoded.into_iter()))
    }

    /// Writes the footer (with the Arrow schema) and flushes the buffered file. Returns the
    /// file's size.
    pub(super) fn finish(mut self) -> PolarsResult<u64> {
        self.writer.end(None)
    }
}
