module gapcert

go 1.26

require (
	github.com/ericlagergren/decimal v0.0.0-20190204014639-71cf34b7c2b5 // indirect
	github.com/inconshreveable/mousetrap v1.1.0 // indirect
	github.com/spf13/cobra v1.10.2 // indirect
	github.com/spf13/pflag v1.0.9 // indirect
	gonum.org/v1/gonum v0.17.0 // indirect
)
