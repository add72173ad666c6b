module assay

go 1.26.8

require (
	github.com/ALTree/bigfloat v0.0.0-20220102081255-38c8b72a9924
	github.com/go-python/gpython v0.2.0
	github.com/gomarkdown/markdown v0.0.0-20261107153045-a51d70be185e
	gonum.org/v1/gonum v0.17.0
)
